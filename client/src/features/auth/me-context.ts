import { createContext, useContext } from 'react';
import type { MeDto } from '@shared/api/auth';

/** The signed-in person, provided by the sign-in gate around every signed-in page. */
export const MeContext = createContext<MeDto | null>(null);

export function useSignedInUser(): MeDto {
  const me = useContext(MeContext);
  if (!me) throw new Error('useSignedInUser is used outside the sign-in gate.');
  return me;
}
