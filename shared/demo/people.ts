import type { Role } from '../schemas/roles';

/**
 * The invented staff of the demo scenario: one person per role, at the fictional Harrow Vale
 * County (`.example` addresses never deliver). The demo scenario installs them with their grant;
 * the local identity provider offers them on its sign-in page. No real person.
 */
export interface DemoPerson {
  email: string;
  displayName: string;
  role: Role;
  /** Agency-wide, or for the demo program only. */
  scope: 'agency' | 'demo-program';
  /** Groups the local identity provider sends for this person. */
  groups: string[];
}

export const DEMO_PEOPLE: readonly DemoPerson[] = [
  { email: 'ines.halloway@harrow-vale.example', displayName: 'Ines Halloway', role: 'admin', scope: 'agency', groups: ['hv-staff', 'hv-it-admins'] },
  { email: 'tomasz.brink@harrow-vale.example', displayName: 'Tomasz Brink', role: 'analyst', scope: 'demo-program', groups: ['hv-staff', 'hv-research'] },
  { email: 'della.rourke@harrow-vale.example', displayName: 'Della Rourke', role: 'manager', scope: 'demo-program', groups: ['hv-staff', 'hv-energy-assistance'] },
  { email: 'kofi.amadi-lyle@harrow-vale.example', displayName: 'Kofi Amadi-Lyle', role: 'evaluator', scope: 'demo-program', groups: ['hv-staff', 'hv-evaluation-unit'] },
  { email: 'margit.fenwick@harrow-vale.example', displayName: 'Margit Fenwick', role: 'director', scope: 'demo-program', groups: ['hv-staff', 'hv-leadership'] },
];

export function demoPersonFor(role: Role): DemoPerson {
  const person = DEMO_PEOPLE.find((p) => p.role === role);
  if (!person) throw new RangeError(`demoPersonFor: no demo person has the role ${role}`);
  return person;
}
