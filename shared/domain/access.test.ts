import { describe, expect, it } from 'vitest';
import { holdsRole, rolesForProgram, visibleProgramIds } from './access';

describe('holdsRole', () => {
  const analystOf3 = [{ role: 'analyst', programId: 3 }] as const;
  const agencyAdmin = [{ role: 'admin', programId: null }] as const;

  it('lets a program grant act only in its own program', () => {
    expect(holdsRole(analystOf3, ['analyst'], { scope: 'program', programId: 3 })).toBe(true);
    expect(holdsRole(analystOf3, ['analyst'], { scope: 'program', programId: 4 })).toBe(false);
    expect(holdsRole(analystOf3, ['analyst'], { scope: 'agency' })).toBe(false);
  });

  it('lets an agency-wide grant act everywhere, for its role only', () => {
    expect(holdsRole(agencyAdmin, ['admin'], { scope: 'agency' })).toBe(true);
    expect(holdsRole(agencyAdmin, ['admin'], { scope: 'program', programId: 9 })).toBe(true);
    expect(holdsRole(agencyAdmin, ['analyst'], { scope: 'program', programId: 9 })).toBe(false);
  });
});

describe('visibleProgramIds', () => {
  it('is all programs with an agency-wide grant, else the granted ones', () => {
    expect(visibleProgramIds([{ role: 'director', programId: null }])).toBe('all');
    expect(visibleProgramIds([{ role: 'manager', programId: 5 }, { role: 'analyst', programId: 2 }, { role: 'director', programId: 5 }])).toEqual([2, 5]);
    expect(visibleProgramIds([])).toEqual([]);
  });
});

describe('rolesForProgram', () => {
  it('joins program and agency-wide roles without repeats', () => {
    const grants = [
      { role: 'manager', programId: 5 },
      { role: 'evaluator', programId: null },
      { role: 'manager', programId: null },
      { role: 'analyst', programId: 6 },
    ] as const;
    expect(rolesForProgram(grants, 5)).toEqual(['manager', 'evaluator']);
  });
});
