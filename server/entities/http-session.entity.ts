import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/**
 * Browser sessions, read and written by `server/auth/session-store.ts`: this entity and its
 * migration own the table. Session ids are case-sensitive, hence the binary collation.
 */
@Entity({ name: 'http_session' })
export class HttpSession {
  @PrimaryColumn({ type: 'varchar', length: 128, collation: 'utf8mb4_bin' })
  sessionId!: string;

  /** Unix time in seconds after which the session is void (idle timeout, renewed on each request). */
  @Index('idx_http_session_expires')
  @Column({ type: 'int', unsigned: true })
  expires!: number;

  @Column({ type: 'mediumtext', collation: 'utf8mb4_bin', nullable: true })
  data!: string | null;
}
