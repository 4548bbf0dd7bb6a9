import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { AuditAction } from '@shared/schemas/audit';
import { AUDIT_ACTIONS } from '@shared/schemas/audit';
import { CreatedAtColumn } from './columns';

/** Who did what, when. Rows are only ever inserted. */
@Entity({ name: 'audit_event' })
@Index('idx_audit_event_program_time', ['programId', 'occurredAt'])
@Index('idx_audit_event_time', ['occurredAt'])
export class AuditEvent {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @CreatedAtColumn()
  occurredAt!: Date;

  /** The signed-in user, or null for scheduled work and refused sign-ins. */
  @Column({ type: 'int', unsigned: true, nullable: true })
  actorUserId!: number | null;

  /** Display name at the time of the event (users can be renamed or removed later). */
  @Column({ type: 'varchar', length: 200 })
  actorLabel!: string;

  @Column({ type: 'enum', enum: AUDIT_ACTIONS })
  action!: AuditAction;

  @Column({ type: 'int', unsigned: true, nullable: true })
  programId!: number | null;

  @Column({ type: 'varchar', length: 40, nullable: true })
  subjectType!: string | null;

  @Column({ type: 'varchar', length: 64, nullable: true })
  subjectId!: string | null;

  @Column({ type: 'json' })
  details!: Record<string, unknown>;
}
