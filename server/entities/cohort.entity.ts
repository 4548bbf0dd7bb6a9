import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from './columns';
import { Program } from './program.entity';

/** A monthly group of applicants of one program. */
@Entity({ name: 'cohort' })
@Index('uq_cohort_program_period', ['programId', 'period'], { unique: true })
export class Cohort {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @ManyToOne(() => Program, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'program_id', foreignKeyConstraintName: 'fk_cohort_program' })
  program?: Program;

  /** `YYYY-MM`. */
  @Column({ type: 'char', length: 7 })
  period!: string;

  @CreatedAtColumn()
  createdAt!: Date;
}
