import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ExtractDetailDto } from '@shared/api/extracts';
import { EXTRACT_BUSY_STATUSES } from '@shared/schemas/extract';
import { api } from '@/lib/api-client';

export function getExtract(programId: number, extractId: number): Promise<ExtractDetailDto> {
  return api.get<ExtractDetailDto>(`/programs/${programId}/extracts/${extractId}`);
}

export const getExtractQueryOptions = (programId: number, extractId: number) =>
  queryOptions({ queryKey: ['programs', programId, 'extracts', 'detail', extractId], queryFn: () => getExtract(programId, extractId) });

/** One extract; polled every second while the server checks or loads it, so its progress moves. */
export function useExtract(programId: number, extractId: number) {
  return useQuery({
    ...getExtractQueryOptions(programId, extractId),
    staleTime: 0,
    refetchInterval: (query) => (query.state.data && EXTRACT_BUSY_STATUSES.includes(query.state.data.status) ? 1000 : false),
  });
}
