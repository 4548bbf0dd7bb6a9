import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/**
 * Assertions already accepted, remembered until they expire so that none can be used twice, even
 * against another app instance. Keyed by SHA-256 of issuer and assertion ID.
 */
@Entity({ name: 'used_assertion' })
export class UsedAssertion {
  @PrimaryColumn({ type: 'char', length: 64 })
  idHash!: string;

  @Index('idx_used_assertion_expires')
  @Column({ type: 'datetime', precision: 3 })
  expiresAt!: Date;
}
