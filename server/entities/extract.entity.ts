import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { ExtractReportDto, ExtractProgressDto } from '@shared/api/extracts';
import type { ColumnMapping } from '@shared/schemas/extract';
import { EXTRACT_FORMATS, EXTRACT_STATUSES, type ExtractFormat, type ExtractStatus } from '@shared/schemas/extract';
import { CreatedAtColumn, UpdatedAtColumn } from './columns';
import { ExtractSource } from './extract-source.entity';
import { Program } from './program.entity';

/** Which observation slot columns hold which outcome and covariate (fixed when the extract is validated). */
export interface ObservationSlots {
  outcomes: Record<string, number>;
  covariates: Record<string, number>;
  takeUp: boolean;
  cluster: boolean;
}

const bigintAsNumber = { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) };

/**
 * One uploaded monthly file of a program, from upload to decision. Its observations are visible to
 * the engine only while its status is `accepted` (one per program and period).
 */
@Entity({ name: 'extract' })
@Index('idx_extract_program_period_status', ['programId', 'period', 'status'])
@Index('idx_extract_program_sha256', ['programId', 'sha256'])
@Index('idx_extract_program_uploaded', ['programId', 'uploadedAt'])
@Index('idx_extract_status', ['status'])
export class Extract {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @ManyToOne(() => Program, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'program_id', foreignKeyConstraintName: 'fk_extract_program' })
  program?: Program;

  @Column({ type: 'int', unsigned: true, nullable: true })
  sourceId!: number | null;

  @ManyToOne(() => ExtractSource, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'source_id', foreignKeyConstraintName: 'fk_extract_source' })
  source?: ExtractSource | null;

  /** Cohort period, `YYYY-MM`. */
  @Column({ type: 'char', length: 7 })
  period!: string;

  @Column({ type: 'enum', enum: EXTRACT_STATUSES })
  status!: ExtractStatus;

  @Column({ type: 'enum', enum: EXTRACT_FORMATS })
  format!: ExtractFormat;

  /** The uploaded file's name without folders, shortened. */
  @Column({ type: 'varchar', length: 255 })
  fileName!: string;

  @Column({ type: 'bigint', unsigned: true, transformer: bigintAsNumber })
  byteSize!: number;

  /** SHA-256 of the uploaded bytes, hex: recognises a second upload of the same file. */
  @Column({ type: 'char', length: 64 })
  sha256!: string;

  /** XLSX: the worksheet read. */
  @Column({ type: 'varchar', length: 100, nullable: true })
  sheet!: string | null;

  /** CSV: the field delimiter found in the header line. */
  @Column({ type: 'varchar', length: 1, nullable: true })
  delimiter!: string | null;

  @Column({ type: 'json' })
  columns!: string[];

  @Column({ type: 'char', length: 64 })
  headerFingerprint!: string;

  @Column({ type: 'json', nullable: true })
  mapping!: ColumnMapping | null;

  @Column({ type: 'enum', enum: ['saved', 'entered'], nullable: true })
  mappingOrigin!: 'saved' | 'entered' | null;

  @Column({ type: 'json', nullable: true })
  slots!: ObservationSlots | null;

  @Column({ type: 'json', nullable: true })
  report!: ExtractReportDto | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  rowsRead!: number | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  rowsAccepted!: number | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  rowsRejected!: number | null;

  /** A whole-file problem (blocks acceptance) or the reason processing failed. */
  @Column({ type: 'varchar', length: 60, nullable: true })
  problemCode!: string | null;

  @Column({ type: 'varchar', length: 1000, nullable: true })
  problemMessage!: string | null;

  @Column({ type: 'json', nullable: true })
  progress!: ExtractProgressDto | null;

  /** How many times background work started on it (a restart resumes interrupted work). */
  @Column({ type: 'smallint', unsigned: true, default: 0 })
  attempts!: number;

  @CreatedAtColumn()
  uploadedAt!: Date;

  @Column({ type: 'int', unsigned: true, nullable: true })
  uploadedByUserId!: number | null;

  @Column({ type: 'varchar', length: 200 })
  uploadedByLabel!: string;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  decidedAt!: Date | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  decidedByUserId!: number | null;

  @Column({ type: 'varchar', length: 200, nullable: true })
  decidedByLabel!: string | null;

  @Column({ type: 'varchar', length: 500, nullable: true })
  decisionNote!: string | null;

  /** When its observations last became the visible ones (accept or restore). */
  @Column({ type: 'datetime', precision: 3, nullable: true })
  acceptedAt!: Date | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  supersededById!: number | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  supersededAt!: Date | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  observationsPurgedAt!: Date | null;

  @UpdatedAtColumn()
  updatedAt!: Date;
}
