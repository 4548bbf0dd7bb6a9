import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn } from './columns';
import type { EligibleSide } from '@shared/schemas/program';

/** A score-rationed program evaluated by Cutline. */
@Entity({ name: 'program' })
export class Program {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Index('uq_program_slug', { unique: true })
  @Column({ type: 'varchar', length: 64 })
  slug!: string;

  @Column({ type: 'varchar', length: 200 })
  name!: string;

  @Column({ type: 'text' })
  description!: string;

  @Column({ type: 'varchar', length: 200 })
  scoreLabel!: string;

  @Column({ type: 'varchar', length: 60 })
  scoreUnit!: string;

  @Column({ type: 'double' })
  scoreMin!: number;

  @Column({ type: 'double' })
  scoreMax!: number;

  @Column({ type: 'enum', enum: ['at-or-above', 'at-or-below'] })
  eligibleSide!: EligibleSide;

  /** IANA time zone of the agency; schedules and dates on screen use it. */
  @Column({ type: 'varchar', length: 64 })
  timeZone!: string;

  /** Plural noun for the people served, in plain-language summaries. */
  @Column({ type: 'varchar', length: 60, default: 'applicants' })
  populationLabel!: string;

  /** Taking part, as a verb phrase ("take the credit"). */
  @Column({ type: 'varchar', length: 100, default: 'take part' })
  takeUpPhrase!: string;

  /** Largest share of rejected rows with which an extract may still be accepted (0.02 = 2%). */
  @Column({ type: 'decimal', precision: 5, scale: 4, default: 0.02 })
  maxRejectedShare!: number;

  /** Months of row-level observations kept before the purge job deletes them (results stay). */
  @Column({ type: 'smallint', unsigned: true, default: 36 })
  retentionMonths!: number;

  @CreatedAtColumn()
  createdAt!: Date;

  @UpdatedAtColumn()
  updatedAt!: Date;
}
