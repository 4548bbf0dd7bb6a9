import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { GrantDto, UserDto } from '@shared/api/auth';
import type { ListDto, ProgramSummaryDto } from '@shared/api/programs';
import type { GrantCreateInput, UserCreateInput } from '@shared/schemas/users';
import { api } from '@/lib/api-client';

export const getUsersQueryOptions = (page: number, q: string) =>
  queryOptions({
    queryKey: ['admin', 'users', { page, q }],
    queryFn: () => api.get<ListDto<UserDto>>('/admin/users', { page, pageSize: 25, q: q || undefined }),
    placeholderData: (previous) => previous,
  });

export const getUserQueryOptions = (userId: number) =>
  queryOptions({ queryKey: ['admin', 'user', userId], queryFn: () => api.get<UserDto>(`/admin/users/${userId}`) });

export function useUsers(page: number, q: string) {
  return useQuery(getUsersQueryOptions(page, q));
}

export function useUser(userId: number) {
  return useQuery(getUserQueryOptions(userId));
}

/** After any change to people or grants, lists and details are read again. */
function useInvalidatePeople() {
  const client = useQueryClient();
  return () => client.invalidateQueries({ queryKey: ['admin'] });
}

export function useCreateUser() {
  const invalidate = useInvalidatePeople();
  return useMutation({ mutationFn: (input: UserCreateInput) => api.post<UserDto>('/admin/users', input), onSuccess: invalidate });
}

export function useSetUserActive(userId: number) {
  const invalidate = useInvalidatePeople();
  return useMutation({ mutationFn: (active: boolean) => api.patch<UserDto>(`/admin/users/${userId}`, { active }), onSuccess: invalidate });
}

export function useAddGrant(userId: number) {
  const invalidate = useInvalidatePeople();
  return useMutation({ mutationFn: (input: GrantCreateInput) => api.post<GrantDto>(`/admin/users/${userId}/grants`, input), onSuccess: invalidate });
}

export function useRevokeGrant() {
  const invalidate = useInvalidatePeople();
  return useMutation({ mutationFn: (grantId: number) => api.delete<void>(`/admin/grants/${grantId}`), onSuccess: invalidate });
}

/** Programs to grant roles for (an agency-wide administrator sees them all; 200 is the API's page limit). */
export function useProgramChoices() {
  return useQuery({ queryKey: ['admin', 'program-choices'], queryFn: () => api.get<ListDto<ProgramSummaryDto>>('/programs', { page: 1, pageSize: 200 }) });
}
