import { queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef } from 'react';
import type { ExtractDetailDto } from '@shared/api/extracts';
import { EXTRACT_BUSY_STATUSES } from '@shared/schemas/extract';
import { api } from '@/lib/api-client';

export function getExtract(programId: number, extractId: number): Promise<ExtractDetailDto> {
  return api.get<ExtractDetailDto>(`/programs/${programId}/extracts/${extractId}`);
}

export const getExtractQueryOptions = (programId: number, extractId: number) =>
  queryOptions({ queryKey: ['programs', programId, 'extracts', 'detail', extractId], queryFn: () => getExtract(programId, extractId) });

/**
 * One extract; polled every second while the server checks or loads it, so its progress moves.
 * When the work ends, the program's extract list is refreshed too (it shows the new status).
 */
export function useExtract(programId: number, extractId: number) {
  const queryClient = useQueryClient();
  const query = useQuery({
    ...getExtractQueryOptions(programId, extractId),
    staleTime: 0,
    refetchInterval: (q) => (q.state.data && EXTRACT_BUSY_STATUSES.includes(q.state.data.status) ? 1000 : false),
  });
  const previous = useRef(query.data?.status);
  useEffect(() => {
    const status = query.data?.status;
    if (previous.current && status && status !== previous.current) {
      void queryClient.invalidateQueries({ queryKey: ['programs', programId, 'extracts'], refetchType: 'all' });
    }
    previous.current = status;
  }, [query.data?.status, programId, queryClient]);
  return query;
}
