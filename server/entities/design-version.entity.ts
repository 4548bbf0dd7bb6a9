import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { DesignSettings } from '@shared/schemas/design';
import { CreatedAtColumn } from './columns';
import { EvaluationDesign } from './evaluation-design.entity';

/** One immutable version of a design's settings. Rows are only ever inserted. */
@Entity({ name: 'design_version' })
@Index('uq_design_version_design_version', ['designId', 'version'], { unique: true })
export class DesignVersion {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  designId!: number;

  @ManyToOne(() => EvaluationDesign, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'design_id', foreignKeyConstraintName: 'fk_design_version_design' })
  design?: EvaluationDesign;

  @Column({ type: 'int', unsigned: true })
  version!: number;

  @Column({ type: 'json' })
  settings!: DesignSettings;

  @Column({ type: 'text', nullable: true })
  reason!: string | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  createdByUserId!: number | null;

  @Column({ type: 'varchar', length: 200 })
  createdByLabel!: string;

  @CreatedAtColumn()
  createdAt!: Date;
}
