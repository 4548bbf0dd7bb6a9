import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Program } from './program.entity';

/** One row of a program's cutoff schedule: the cutoff from `firstPeriod` until the next change. */
@Entity({ name: 'cutoff_change' })
@Index('uq_cutoff_change_program_period', ['programId', 'firstPeriod'], { unique: true })
export class CutoffChange {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @ManyToOne(() => Program, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'program_id', foreignKeyConstraintName: 'fk_cutoff_change_program' })
  program?: Program;

  @Column({ type: 'double' })
  cutoff!: number;

  @Column({ type: 'char', length: 7 })
  firstPeriod!: string;
}
