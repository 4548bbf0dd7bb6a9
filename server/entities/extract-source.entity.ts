import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from './columns';
import { Program } from './program.entity';

/** Where a program's extracts come from, e.g. "Case-management export" (shown as "data source"). */
@Entity({ name: 'extract_source' })
@Index('uq_extract_source_program_name', ['programId', 'name'], { unique: true })
export class ExtractSource {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @ManyToOne(() => Program, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'program_id', foreignKeyConstraintName: 'fk_extract_source_program' })
  program?: Program;

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @CreatedAtColumn()
  createdAt!: Date;
}
