import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { SummarySchedule } from '@shared/schemas/subscription';
import { CreatedAtColumn, UpdatedAtColumn } from './columns';
import { User } from './user.entity';

/** A director's summary e-mail: when, which programs, paused or not. One per person. */
@Entity({ name: 'summary_subscription' })
export class SummarySubscription {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Index('uq_summary_subscription_user', { unique: true })
  @Column({ type: 'int', unsigned: true })
  userId!: number;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'fk_summary_subscription_user' })
  user?: User;

  @Column({ type: 'boolean', default: false })
  paused!: boolean;

  @Column({ type: 'json' })
  schedule!: SummarySchedule;

  /** Empty: every program the person is granted as director. */
  @Column({ type: 'json' })
  programIds!: number[];

  @Column({ type: 'boolean', default: false })
  attachAnnex!: boolean;

  /** The scheduled instant of the last summary sent (not the clock time it went out). */
  @Column({ type: 'datetime', precision: 3, nullable: true })
  lastDueAt!: Date | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  lastSentAt!: Date | null;

  @CreatedAtColumn()
  createdAt!: Date;

  @UpdatedAtColumn()
  updatedAt!: Date;
}
