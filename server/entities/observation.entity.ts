import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * One applicant of one accepted (or superseded) extract. Outcomes and covariates sit in typed slot
 * columns (`o1`…`o8`, `c1`…`c8`); the extract's `slots` say which key each slot holds. The primary
 * key makes one extract's rows one contiguous range, read in a single scan into typed arrays.
 * Loaded only by `LOAD DATA` into a staging table and one `INSERT … SELECT` (see ingest/).
 */
@Entity({ name: 'observation' })
export class Observation {
  @PrimaryColumn({ type: 'int', unsigned: true })
  extractId!: number;

  /** Line of the row in the file. */
  @PrimaryColumn({ type: 'int', unsigned: true })
  rowNo!: number;

  /** HMAC-SHA-256 of the program id and the subject identifier (the raw identifier is never stored). */
  @Column({ type: 'binary', length: 32 })
  subjectHash!: Buffer;

  @Column({ type: 'double' })
  score!: number;

  @Column({ type: 'tinyint', unsigned: true, nullable: true })
  takeUp!: number | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  clusterCode!: number | null;

  @Column({ type: 'double', nullable: true }) o1!: number | null;
  @Column({ type: 'double', nullable: true }) o2!: number | null;
  @Column({ type: 'double', nullable: true }) o3!: number | null;
  @Column({ type: 'double', nullable: true }) o4!: number | null;
  @Column({ type: 'double', nullable: true }) o5!: number | null;
  @Column({ type: 'double', nullable: true }) o6!: number | null;
  @Column({ type: 'double', nullable: true }) o7!: number | null;
  @Column({ type: 'double', nullable: true }) o8!: number | null;
  @Column({ type: 'double', nullable: true }) c1!: number | null;
  @Column({ type: 'double', nullable: true }) c2!: number | null;
  @Column({ type: 'double', nullable: true }) c3!: number | null;
  @Column({ type: 'double', nullable: true }) c4!: number | null;
  @Column({ type: 'double', nullable: true }) c5!: number | null;
  @Column({ type: 'double', nullable: true }) c6!: number | null;
  @Column({ type: 'double', nullable: true }) c7!: number | null;
  @Column({ type: 'double', nullable: true }) c8!: number | null;
}
