import { RoleSchema, type Role } from '@shared/schemas/roles';

/** One line of `CUTLINE_SAML_GROUP_ROLES`: members of `group` hold `role`, agency-wide or for one program. */
export interface GroupRoleRule {
  group: string;
  role: Role;
  /** Program slug, or null for agency-wide. */
  programSlug: string | null;
}

/**
 * Parses `CUTLINE_SAML_GROUP_ROLES`: entries separated by `;` or new lines, each
 * `group=role` (agency-wide) or `group=role@program-slug`. The last `=` separates the group from
 * the role, so directory-style group names such as `CN=Evaluation,OU=Groups,DC=agency` work.
 * @throws Error naming the entry that cannot be read
 * @example parseGroupRoles('hv-it-admins=admin; hv-research=analyst@winter-heating-credit')
 */
export function parseGroupRoles(text: string): GroupRoleRule[] {
  const rules: GroupRoleRule[] = [];
  for (const raw of text.split(/[;\n]/)) {
    const entry = raw.trim();
    if (!entry) continue;
    const eq = entry.lastIndexOf('=');
    const group = entry.slice(0, eq).trim();
    const [roleText = '', slug] = entry.slice(eq + 1).trim().split('@');
    const role = RoleSchema.safeParse(roleText.trim());
    if (eq <= 0 || !group || !role.success || (slug !== undefined && !/^[a-z0-9-]{2,64}$/.test(slug.trim()))) {
      throw new Error(
        `CUTLINE_SAML_GROUP_ROLES: cannot read "${entry}". Write group=role or group=role@program-slug, where role is admin, analyst, manager, evaluator or director.`,
      );
    }
    rules.push({ group, role: role.data, programSlug: slug === undefined ? null : slug.trim() });
  }
  return rules;
}

/** The rules that apply to someone in `groups` (group names compare exactly). */
export function rulesForGroups(rules: readonly GroupRoleRule[], groups: readonly string[]): GroupRoleRule[] {
  const member = new Set(groups);
  return rules.filter((r) => member.has(r.group));
}
