import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { DesignSettings } from '@shared/schemas/design';
import { CreatedAtColumn } from './columns';
import { EvaluationDesign } from './evaluation-design.entity';

/** A change to a locked design: from which version to which, why, and which settings. Insert-only. */
@Entity({ name: 'design_deviation' })
@Index('idx_design_deviation_design', ['designId', 'toVersion'])
export class DesignDeviation {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  designId!: number;

  @ManyToOne(() => EvaluationDesign, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'design_id', foreignKeyConstraintName: 'fk_design_deviation_design' })
  design?: EvaluationDesign;

  @Column({ type: 'int', unsigned: true })
  fromVersion!: number;

  @Column({ type: 'int', unsigned: true })
  toVersion!: number;

  @Column({ type: 'text' })
  reason!: string;

  @Column({ type: 'json' })
  changed!: Array<keyof DesignSettings>;

  @Column({ type: 'int', unsigned: true, nullable: true })
  recordedByUserId!: number | null;

  @Column({ type: 'varchar', length: 200 })
  recordedByLabel!: string;

  @CreatedAtColumn()
  recordedAt!: Date;
}
