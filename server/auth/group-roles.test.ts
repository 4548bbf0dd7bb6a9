import { describe, expect, it } from 'vitest';
import { parseGroupRoles, rulesForGroups } from './group-roles';

describe('parseGroupRoles', () => {
  it('reads agency-wide and program rules, and directory-style group names', () => {
    const rules = parseGroupRoles('hv-it-admins=admin;\n CN=Evaluation,OU=Groups,DC=hv = evaluator@winter-heating-credit ;');
    expect(rules).toEqual([
      { group: 'hv-it-admins', role: 'admin', programSlug: null },
      { group: 'CN=Evaluation,OU=Groups,DC=hv', role: 'evaluator', programSlug: 'winter-heating-credit' },
    ]);
    expect(parseGroupRoles('  ')).toEqual([]);
  });

  it('refuses an unknown role or a malformed entry, naming it', () => {
    expect(() => parseGroupRoles('hv-staff=superuser')).toThrow(/"hv-staff=superuser"/);
    expect(() => parseGroupRoles('=admin')).toThrow(/cannot read/);
    expect(() => parseGroupRoles('staff=admin@Not A Slug')).toThrow(/cannot read/);
  });
});

describe('rulesForGroups', () => {
  it('keeps the rules of the groups the person is in', () => {
    const rules = parseGroupRoles('a=admin;b=analyst@p1;c=director');
    expect(rulesForGroups(rules, ['b', 'c', 'z']).map((r) => r.role)).toEqual(['analyst', 'director']);
  });
});
