import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One rejected row of an extract's validation report. Holds no subject identifier and no unmapped column. */
@Entity({ name: 'extract_rejected_row' })
export class ExtractRejectedRow {
  @PrimaryColumn({ type: 'int', unsigned: true })
  extractId!: number;

  /** Line (CSV) or row number (XLSX) in the file, the header being line 1 or later. */
  @PrimaryColumn({ type: 'int', unsigned: true })
  line!: number;

  @Column({ type: 'varchar', length: 200, nullable: true })
  columnName!: string | null;

  @Column({ type: 'varchar', length: 60 })
  code!: string;

  @Column({ type: 'varchar', length: 300 })
  reason!: string;

  /** The offending cell, at most 100 characters; null for identifier problems. */
  @Column({ type: 'varchar', length: 100, nullable: true })
  value!: string | null;
}
