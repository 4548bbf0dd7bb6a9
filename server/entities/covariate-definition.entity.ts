import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { VariableKind } from '@shared/schemas/program';
import { Program } from './program.entity';

/** A pre-determined characteristic used to check balance at the cutoff. */
@Entity({ name: 'covariate_definition' })
@Index('uq_covariate_definition_program_key', ['programId', 'key'], { unique: true })
export class CovariateDefinition {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @ManyToOne(() => Program, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'program_id', foreignKeyConstraintName: 'fk_covariate_definition_program' })
  program?: Program;

  @Column({ type: 'varchar', length: 64 })
  key!: string;

  @Column({ type: 'varchar', length: 200 })
  label!: string;

  @Column({ type: 'varchar', length: 60 })
  unit!: string;

  @Column({ type: 'enum', enum: ['binary', 'continuous'] })
  kind!: VariableKind;

  @Column({ type: 'smallint', unsigned: true })
  position!: number;
}
