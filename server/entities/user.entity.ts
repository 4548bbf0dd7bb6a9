import { Column, Entity, Index, OneToMany, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn } from './columns';
import type { RoleGrant } from './role-grant.entity';

/** A member of staff who signs in through the agency's identity provider. Keyed by e-mail (lower-case). */
@Entity({ name: 'app_user' })
export class User {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Index('uq_app_user_email', { unique: true })
  @Column({ type: 'varchar', length: 254 })
  email!: string;

  @Column({ type: 'varchar', length: 200 })
  displayName!: string;

  /** The identity provider's subject identifier (NameID) from the latest sign-in. */
  @Column({ type: 'varchar', length: 255, nullable: true })
  nameId!: string | null;

  /** A switched-off account cannot sign in, and its open sessions stop working. */
  @Column({ type: 'boolean', default: true })
  active!: boolean;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  lastSignInAt!: Date | null;

  @CreatedAtColumn()
  createdAt!: Date;

  @UpdatedAtColumn()
  updatedAt!: Date;

  @OneToMany('RoleGrant', (g: RoleGrant) => g.user)
  grants?: RoleGrant[];
}
