import type { ReactNode } from 'react';
import { Empty } from '@/components/ui/states';
import { useSignedInUser } from '../me-context';
import { isAgencyAdmin } from '../permissions';

/** Pages for agency-wide administrators: others see why they cannot use it (the server refuses them too). */
export function AgencyAdminOnly({ children }: { children: ReactNode }) {
  const me = useSignedInUser();
  if (!isAgencyAdmin(me)) {
    return <Empty title="This page is for administrators">It needs an agency-wide administrator role. Ask an administrator if you need it.</Empty>;
  }
  return <>{children}</>;
}
