import { z } from 'zod';
import { PageQuerySchema } from './paging';
import { RoleSchema } from './roles';

/** An e-mail address as Cutline keys people by it: trimmed and lower-case. */
export const EmailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email('Enter an e-mail address such as name@agency.example.').max(254));

export const DisplayNameSchema = z.string().trim().min(1, 'Enter the person’s name.').max(200, 'A name has at most 200 characters.');

/** `POST /api/admin/users`: add a person before their first sign-in, so roles can be granted ahead. */
export const UserCreateSchema = z.object({
  email: EmailSchema,
  displayName: DisplayNameSchema,
});
export type UserCreateInput = z.infer<typeof UserCreateSchema>;

/**
 * `PATCH /api/admin/users/:userId`. A switched-off account cannot sign in and its sessions end.
 * Names come from the identity provider at each sign-in, so they are not edited here.
 */
export const UserUpdateSchema = z.object({
  active: z.boolean(),
});
export type UserUpdateInput = z.infer<typeof UserUpdateSchema>;

/** `GET /api/admin/users?q=`: `q` matches name or e-mail. */
export const UserListQuerySchema = PageQuerySchema.extend({
  q: z.string().trim().max(200).optional(),
});
export type UserListQuery = z.infer<typeof UserListQuerySchema>;

/** `POST /api/admin/users/:userId/grants`. `programId: null` grants the role agency-wide. */
export const GrantCreateSchema = z.object({
  role: RoleSchema,
  programId: z.number().int().positive().nullable(),
});
export type GrantCreateInput = z.infer<typeof GrantCreateSchema>;

/** Where a grant came from: given by an administrator, or derived from an identity-provider group at sign-in. */
export const GRANT_SOURCES = ['admin', 'group'] as const;
export type GrantSource = (typeof GRANT_SOURCES)[number];
