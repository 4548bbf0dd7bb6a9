import { z } from 'zod';

/**
 * What each role may do (enforced on the server, mirrored in the client's navigation):
 * - admin: programs, users, grants, schedules, audit trail, the technical annex
 * - analyst: extracts, mappings, designs, runs, the technical annex
 * - manager: dashboards, acknowledge caveats
 * - evaluator: read all results of granted programs, download the annex and the de-identified data
 * - director: read summaries, receive the scheduled e-mail
 */
export const ROLES = ['admin', 'analyst', 'manager', 'evaluator', 'director'] as const;
export const RoleSchema = z.enum(ROLES);
export type Role = z.infer<typeof RoleSchema>;
