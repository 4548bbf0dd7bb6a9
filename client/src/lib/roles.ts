import type { GrantDto } from '@shared/api/auth';
import type { Role } from '@shared/schemas/roles';

/** Role names on screen. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  analyst: 'Analyst',
  manager: 'Program manager',
  evaluator: 'Evaluator',
  director: 'Director',
};

/** "Analyst · Winter Heating Credit", "Administrator · agency-wide". */
export function grantLabel(g: Pick<GrantDto, 'role' | 'programId' | 'programName'>): string {
  return `${ROLE_LABELS[g.role]} · ${g.programId === null ? 'agency-wide' : (g.programName ?? `program ${g.programId}`)}`;
}
