import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { ROLES, type Role } from '@shared/schemas/roles';
import { GRANT_SOURCES, type GrantSource } from '@shared/schemas/users';
import { CreatedAtColumn } from './columns';
import { Program } from './program.entity';
import { User } from './user.entity';

/**
 * One role for one person, for one program or agency-wide (`programId` null), given by an
 * administrator or derived from an identity-provider group. The grants service keeps one
 * administrator grant per (user, role, program) by locking the user row while it checks, because
 * MariaDB unique indexes let NULLs repeat.
 */
@Entity({ name: 'role_grant' })
@Index('idx_role_grant_user', ['userId'])
@Index('idx_role_grant_program', ['programId'])
export class RoleGrant {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  userId!: number;

  @ManyToOne(() => User, (u) => u.grants, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'fk_role_grant_user' })
  user?: User;

  @Column({ type: 'enum', enum: ROLES })
  role!: Role;

  @Column({ type: 'int', unsigned: true, nullable: true })
  programId!: number | null;

  @ManyToOne(() => Program, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'program_id', foreignKeyConstraintName: 'fk_role_grant_program' })
  program?: Program;

  @Column({ type: 'enum', enum: GRANT_SOURCES })
  source!: GrantSource;

  /** The identity-provider group behind a `group` grant; re-checked at every sign-in. */
  @Column({ type: 'varchar', length: 255, nullable: true })
  groupName!: string | null;

  /** The administrator who gave an `admin` grant (null for the demo scenario and for groups). */
  @Column({ type: 'int', unsigned: true, nullable: true })
  grantedByUserId!: number | null;

  @CreatedAtColumn()
  createdAt!: Date;
}
