import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { ColumnMapping } from '@shared/schemas/extract';
import { UpdatedAtColumn } from './columns';
import { ExtractSource } from './extract-source.entity';

/**
 * A saved column mapping of one data source for one header. The fingerprint (SHA-256 of the sorted,
 * normalised column names) recognises next month's file; a changed header has another fingerprint.
 */
@Entity({ name: 'saved_mapping' })
@Index('uq_saved_mapping_source_fingerprint', ['sourceId', 'headerFingerprint'], { unique: true })
@Index('idx_saved_mapping_program_fingerprint', ['programId', 'headerFingerprint'])
export class SavedMapping {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @Column({ type: 'int', unsigned: true })
  sourceId!: number;

  @ManyToOne(() => ExtractSource, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'source_id', foreignKeyConstraintName: 'fk_saved_mapping_source' })
  source?: ExtractSource;

  @Column({ type: 'char', length: 64 })
  headerFingerprint!: string;

  /** Column names as the file had them, in file order. */
  @Column({ type: 'json' })
  columns!: string[];

  @Column({ type: 'json' })
  mapping!: ColumnMapping;

  @Column({ type: 'varchar', length: 200 })
  savedByLabel!: string;

  @Column({ type: 'int', unsigned: true, nullable: true })
  savedByUserId!: number | null;

  @UpdatedAtColumn()
  savedAt!: Date;
}
