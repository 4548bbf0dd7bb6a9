import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { GoodDirection, VariableKind } from '@shared/schemas/program';
import { Program } from './program.entity';

/** An outcome the program is evaluated on. */
@Entity({ name: 'outcome_definition' })
@Index('uq_outcome_definition_program_key', ['programId', 'key'], { unique: true })
export class OutcomeDefinition {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @ManyToOne(() => Program, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'program_id', foreignKeyConstraintName: 'fk_outcome_definition_program' })
  program?: Program;

  @Column({ type: 'varchar', length: 64 })
  key!: string;

  @Column({ type: 'varchar', length: 200 })
  label!: string;

  @Column({ type: 'varchar', length: 60 })
  unit!: string;

  @Column({ type: 'enum', enum: ['binary', 'continuous'] })
  kind!: VariableKind;

  @Column({ type: 'enum', enum: ['higher', 'lower'] })
  goodDirection!: GoodDirection;

  /** Display order. */
  @Column({ type: 'smallint', unsigned: true })
  position!: number;
}
