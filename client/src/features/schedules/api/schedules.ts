import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { SchedulesDto } from '@shared/api/schedules';
import { api } from '@/lib/api-client';

export const getSchedules = () => api.get<SchedulesDto>('/admin/schedules');
export const getSchedulesQueryOptions = () => queryOptions({ queryKey: ['admin', 'schedules'], queryFn: getSchedules });
export const useSchedules = () => useQuery(getSchedulesQueryOptions());

/** Pause or resume one director's summary. */
export function useSetSummaryPaused() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, paused }: { id: number; paused: boolean }) => api.patch<SchedulesDto>(`/admin/schedules/${id}`, { paused }),
    onSuccess: (data) => queryClient.setQueryData(getSchedulesQueryOptions().queryKey, data),
  });
}
