import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/**
 * Sign-in requests sent to the identity provider and not yet answered. An answer must name one of
 * these (InResponseTo); it is deleted on use. Kept in MariaDB so that any app instance can take
 * the answer to a request another instance sent.
 */
@Entity({ name: 'saml_request' })
export class SamlRequest {
  @PrimaryColumn({ type: 'varchar', length: 128, collation: 'utf8mb4_bin' })
  id!: string;

  @Index('idx_saml_request_created')
  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}
