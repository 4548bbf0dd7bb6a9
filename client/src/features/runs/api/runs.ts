import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ListDto } from '@shared/api/programs';
import type { RunDto } from '@shared/api/runs';
import { api } from '@/lib/api-client';

const ACTIVE = new Set(['queued', 'running']);

export const getRunsQueryOptions = (programId: number, page = 1) =>
  queryOptions({
    queryKey: ['programs', programId, 'runs', { page }],
    queryFn: () => api.get<ListDto<RunDto>>(`/programs/${programId}/runs`, { page, pageSize: 20 }),
    // Watch progress while a run is queued or running.
    refetchInterval: (q) => (q.state.data?.items.some((r) => ACTIVE.has(r.status)) ? 1500 : false),
  });

export const useRuns = (programId: number, page = 1) => useQuery(getRunsQueryOptions(programId, page));

export function useStartRecompute(programId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ run: RunDto; joined: boolean }>(`/programs/${programId}/runs`),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['programs', programId, 'runs'] }),
  });
}
