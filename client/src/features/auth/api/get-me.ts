import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeDto } from '@shared/api/auth';
import { api, setCsrfToken } from '@/lib/api-client';
import { setDisplaySettings } from '@/lib/format';

/** Who is signed in; also arms the API client with the session's CSRF token. */
export async function getMe(): Promise<MeDto> {
  const me = await api.get<MeDto>('/me');
  setCsrfToken(me.csrfToken);
  setDisplaySettings(me.agency);
  return me;
}

export const getMeQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(getMeQueryOptions());
}
