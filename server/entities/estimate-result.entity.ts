import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type {
  BandwidthDto,
  CaveatDto,
  EstimateDto,
  FirstStageDto,
  PoolingDto,
  ProvenanceDto,
  ResultScopeDto,
  SampleSizeDto,
  SideLimitsDto,
} from '@shared/api/results';
import { EvaluationDesign } from './evaluation-design.entity';

/** Figures of a result, stored as one JSON document (the shapes of `shared/api/results.ts`). */
export interface StoredFigures {
  level: number;
  problem: { code: string; message: string } | null;
  firstStage: FirstStageDto | null;
  itt: EstimateDto | null;
  effect: EstimateDto | null;
  bandwidth: BandwidthDto | null;
  n: SampleSizeDto | null;
  pooling: PoolingDto | null;
  /** Absent in rows written before the limits were kept. */
  limits?: SideLimitsDto | null;
}

/**
 * The current result of one outcome in one cohort or pooled window under a design. A recompute
 * replaces a design's changed rows in one transaction; until then the old row stays, marked stale
 * when its inputs changed. `inputSignature` is the SHA-256 of everything the figures depend on,
 * so a run with nothing new writes nothing.
 */
@Entity({ name: 'estimate_result' })
@Index('uq_estimate_result_scope', ['designId', 'scopeKey', 'outcomeKey'], { unique: true })
@Index('idx_estimate_result_program', ['programId', 'scopeKind', 'lastPeriod'])
export class EstimateResult {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @Column({ type: 'int', unsigned: true })
  designId!: number;

  @ManyToOne(() => EvaluationDesign, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'design_id', foreignKeyConstraintName: 'fk_estimate_result_design' })
  design?: EvaluationDesign;

  @Column({ type: 'int', unsigned: true })
  designVersionId!: number;

  @Column({ type: 'int', unsigned: true })
  designVersion!: number;

  /** `cohort:YYYY-MM`, `window:last-N`, `window:previous-N`. */
  @Column({ type: 'varchar', length: 40 })
  scopeKey!: string;

  @Column({ type: 'enum', enum: ['cohort', 'window'] })
  scopeKind!: 'cohort' | 'window';

  @Column({ type: 'char', length: 7 })
  firstPeriod!: string;

  @Column({ type: 'char', length: 7 })
  lastPeriod!: string;

  @Column({ type: 'varchar', length: 64 })
  outcomeKey!: string;

  @Column({ type: 'enum', enum: ['ok', 'not-estimable'] })
  status!: 'ok' | 'not-estimable';

  @Column({ type: 'json' })
  scope!: ResultScopeDto;

  @Column({ type: 'json' })
  figures!: StoredFigures;

  @Column({ type: 'json' })
  caveats!: CaveatDto[];

  @Column({ type: 'json' })
  provenance!: ProvenanceDto;

  @Column({ type: 'char', length: 64 })
  inputSignature!: string;

  @Column({ type: 'int', unsigned: true })
  runId!: number;

  @Column({ type: 'datetime', precision: 3 })
  computedAt!: Date;

  @Column({ type: 'boolean', default: false })
  stale!: boolean;

  @Column({ type: 'varchar', length: 300, nullable: true })
  staleReason!: string | null;

  /** Every cohort in the scope was accepted after the design was locked. */
  @Column({ type: 'boolean', default: false })
  preRegistered!: boolean;
}
