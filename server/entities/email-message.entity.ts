import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { EMAIL_KINDS, type EmailKind } from '@shared/api/mail';
import { CreatedAtColumn } from './columns';

/** Every e-mail Cutline sent or tried to send: to, when, subject, Message-ID, and the bodies. */
@Entity({ name: 'email_message' })
@Index('idx_email_message_sent', ['sentAt'])
export class EmailMessage {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'enum', enum: EMAIL_KINDS })
  kind!: EmailKind;

  @Column({ type: 'int', unsigned: true, nullable: true })
  userId!: number | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  subscriptionId!: number | null;

  @Column({ type: 'varchar', length: 254 })
  toAddress!: string;

  @Column({ type: 'varchar', length: 300 })
  subject!: string;

  @Index('uq_email_message_message_id', { unique: true })
  @Column({ type: 'varchar', length: 200 })
  messageId!: string;

  @Column({ type: 'enum', enum: ['sent', 'failed'] })
  status!: 'sent' | 'failed';

  @Column({ type: 'text', nullable: true })
  error!: string | null;

  @Column({ type: 'json' })
  programIds!: number[];

  @Column({ type: 'mediumtext' })
  html!: string;

  @Column({ type: 'mediumtext' })
  text!: string;

  @CreatedAtColumn()
  sentAt!: Date;
}
