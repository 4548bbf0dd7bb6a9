import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from './columns';

/**
 * A manager's acknowledgement of a caveat on a result, with a comment. Keyed by scope, outcome and
 * caveat code (not the result row), so it survives recomputes that keep the caveat. Insert-only.
 */
@Entity({ name: 'caveat_acknowledgement' })
@Index('idx_caveat_acknowledgement_scope', ['designId', 'scopeKey', 'outcomeKey'])
export class CaveatAcknowledgement {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @Column({ type: 'int', unsigned: true })
  designId!: number;

  @Column({ type: 'varchar', length: 40 })
  scopeKey!: string;

  @Column({ type: 'varchar', length: 64 })
  outcomeKey!: string;

  @Column({ type: 'varchar', length: 64 })
  caveatCode!: string;

  /** The result row acknowledged (it may since have been replaced). */
  @Column({ type: 'int', unsigned: true })
  resultId!: number;

  @Column({ type: 'text' })
  comment!: string;

  @Column({ type: 'int', unsigned: true, nullable: true })
  acknowledgedByUserId!: number | null;

  @Column({ type: 'varchar', length: 200 })
  acknowledgedByLabel!: string;

  @CreatedAtColumn()
  acknowledgedAt!: Date;
}
