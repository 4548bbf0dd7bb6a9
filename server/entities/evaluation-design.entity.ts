import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn } from './columns';
import { Program } from './program.entity';

/**
 * An evaluation design of a program: a name, a chain of versions (`design_version`) and, once an
 * analyst pre-registers it, a lock. Settings are never edited in place; an edit writes a new version.
 */
@Entity({ name: 'evaluation_design' })
@Index('idx_evaluation_design_program', ['programId'])
export class EvaluationDesign {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @ManyToOne(() => Program, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'program_id', foreignKeyConstraintName: 'fk_evaluation_design_program' })
  program?: Program;

  @Column({ type: 'varchar', length: 200 })
  name!: string;

  /**
   * The program id while this is the program's primary design, otherwise null: the unique index
   * allows one primary design per program (MariaDB unique indexes let NULLs repeat).
   */
  @Index('uq_evaluation_design_primary', { unique: true })
  @Column({ type: 'int', unsigned: true, nullable: true })
  primaryOfProgramId!: number | null;

  /** Number of the latest version (versions count from 1). */
  @Column({ type: 'int', unsigned: true })
  currentVersion!: number;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  lockedAt!: Date | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  lockedByUserId!: number | null;

  @Column({ type: 'varchar', length: 200, nullable: true })
  lockedByLabel!: string | null;

  /** The version that was pre-registered. */
  @Column({ type: 'int', unsigned: true, nullable: true })
  lockedVersion!: number | null;

  @Column({ type: 'text', nullable: true })
  lockNote!: string | null;

  /** Cohort periods whose extract was already accepted when the design was locked. */
  @Column({ type: 'json', nullable: true })
  periodsSeenBeforeLock!: string[] | null;

  @CreatedAtColumn()
  createdAt!: Date;

  @UpdatedAtColumn()
  updatedAt!: Date;
}
