import { Column, Entity, JoinColumn, OneToOne, PrimaryColumn } from 'typeorm';
import type { BinDto } from '@shared/api/results';
import { EstimateResult } from './estimate-result.entity';

/** The heavy part of a result (diagnostics, plot bins), read only by the cohort detail and the annex. */
@Entity({ name: 'estimate_result_detail' })
export class EstimateResultDetail {
  @PrimaryColumn({ type: 'int', unsigned: true })
  resultId!: number;

  @OneToOne(() => EstimateResult, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'result_id', foreignKeyConstraintName: 'fk_estimate_result_detail_result' })
  result?: EstimateResult;

  @Column({ type: 'json', nullable: true })
  diagnostics!: Record<string, unknown> | null;

  @Column({ type: 'json' })
  bins!: BinDto[];
}
