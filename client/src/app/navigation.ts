import type { MeDto } from '@shared/api/auth';
import { holdsAnyRole, isAgencyAdmin } from '@/features/auth/permissions';

export interface NavItem {
  to: string;
  label: string;
  /** Match the path exactly (for `/`). */
  end?: boolean;
  /** Shown only to people who may use it (the server checks again). */
  visible: (me: MeDto) => boolean;
}

/** The main navigation, one item a line. Add an item with a `visible` rule that matches the route's `allow(...)`. */
export const NAV_ITEMS: NavItem[] = [
  { to: '/', label: 'Programs', end: true, visible: () => true },
  { to: '/admin/programs', label: 'Program settings', visible: isAgencyAdmin },
  { to: '/admin/users', label: 'People and roles', visible: isAgencyAdmin },
  { to: '/admin/schedules', label: 'Schedules', visible: isAgencyAdmin },
  { to: '/admin/audit', label: 'Audit trail', visible: isAgencyAdmin },
  { to: '/admin/mail', label: 'Sent mail', visible: isAgencyAdmin },
  { to: '/me/summary', label: 'My summary', visible: (me) => holdsAnyRole(me, ['director']) },
];
