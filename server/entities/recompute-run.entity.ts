import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { RUN_STATUSES, RUN_TRIGGERS, type RunStatus, type RunTrigger } from '@shared/api/runs';
import { CreatedAtColumn } from './columns';
import { Program } from './program.entity';

/**
 * One recompute of a program: the queue entry and, once picked up, its log (status, progress,
 * attempts, duration, error). Triggers arriving while one is queued join it (`queuedProgramId`).
 */
@Entity({ name: 'recompute_run' })
@Index('idx_recompute_run_program_requested', ['programId', 'requestedAt'])
@Index('idx_recompute_run_status', ['status', 'nextAttemptAt'])
export class RecomputeRun {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @ManyToOne(() => Program, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'program_id', foreignKeyConstraintName: 'fk_recompute_run_program' })
  program?: Program;

  /**
   * The program id while this run is queued, otherwise null: the unique index keeps at most one
   * queued run per program, so concurrent triggers (from any app instance) coalesce into one.
   */
  @Index('uq_recompute_run_queued', { unique: true })
  @Column({ type: 'int', unsigned: true, nullable: true })
  queuedProgramId!: number | null;

  /** The design computed (the primary design when the run started). */
  @Column({ type: 'int', unsigned: true, nullable: true })
  designId!: number | null;

  @Column({ type: 'enum', enum: RUN_TRIGGERS })
  trigger!: RunTrigger;

  @Column({ type: 'int', unsigned: true, nullable: true })
  requestedByUserId!: number | null;

  @Column({ type: 'varchar', length: 200 })
  requestedByLabel!: string;

  @Column({ type: 'enum', enum: RUN_STATUSES })
  status!: RunStatus;

  @Column({ type: 'smallint', unsigned: true, default: 0 })
  attempts!: number;

  @Column({ type: 'smallint', unsigned: true })
  maxAttempts!: number;

  /** Back-off: a queued run is not picked up before this instant. */
  @Column({ type: 'datetime', precision: 3 })
  nextAttemptAt!: Date;

  @CreatedAtColumn()
  requestedAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  startedAt!: Date | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  finishedAt!: Date | null;

  /** Wall-clock milliseconds of the last attempt. */
  @Column({ type: 'int', unsigned: true, nullable: true })
  durationMs!: number | null;

  @Column({ type: 'int', unsigned: true, default: 0 })
  progressDone!: number;

  @Column({ type: 'int', unsigned: true, default: 0 })
  progressTotal!: number;

  /** Scope key being computed, e.g. `cohort:2026-04`. */
  @Column({ type: 'varchar', length: 40, nullable: true })
  progressCurrent!: string | null;

  @Column({ type: 'int', unsigned: true, default: 0 })
  resultsWritten!: number;

  @Column({ type: 'varchar', length: 64, nullable: true })
  errorCode!: string | null;

  /** Plain words, no personal data. */
  @Column({ type: 'text', nullable: true })
  errorMessage!: string | null;
}
