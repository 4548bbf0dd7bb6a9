import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ExtractDetailDto } from '@shared/api/extracts';
import type { ExtractMappingRequest } from '@shared/schemas/extract';
import { api } from '@/lib/api-client';
import { getDataSourcesQueryOptions } from './get-data-sources';
import { getExtractQueryOptions } from './get-extract';
import { getExtractsQueryOptions } from './get-extracts';

export type ExtractAction = 'accept' | 'reject' | 'restore' | 'retry';

export function decideExtract(programId: number, extractId: number, action: ExtractAction, note?: string): Promise<ExtractDetailDto> {
  const body = action === 'accept' ? { note } : action === 'reject' ? { reason: note } : {};
  return api.post<ExtractDetailDto>(`/programs/${programId}/extracts/${extractId}/${action}`, body);
}

export function setExtractMapping(programId: number, extractId: number, body: ExtractMappingRequest): Promise<ExtractDetailDto> {
  return api.put<ExtractDetailDto>(`/programs/${programId}/extracts/${extractId}/mapping`, body);
}

/** After any change: the extract itself (its answer), the list, and the data sources. */
function useRefresh(programId: number, extractId: number) {
  const queryClient = useQueryClient();
  return (extract: ExtractDetailDto) => {
    queryClient.setQueryData(getExtractQueryOptions(programId, extractId).queryKey, extract);
    void queryClient.invalidateQueries({ queryKey: getExtractsQueryOptions(programId).queryKey.slice(0, 3) });
    void queryClient.invalidateQueries({ queryKey: getDataSourcesQueryOptions(programId).queryKey });
  };
}

/** Accept, reject, restore or retry one extract. */
export function useDecideExtract(programId: number, extractId: number) {
  const refresh = useRefresh(programId, extractId);
  return useMutation({
    mutationFn: ({ action, note }: { action: ExtractAction; note?: string }) => decideExtract(programId, extractId, action, note),
    onSuccess: refresh,
  });
}

/** Sends the column mapping; validation starts on the server. */
export function useSetExtractMapping(programId: number, extractId: number) {
  const refresh = useRefresh(programId, extractId);
  return useMutation({ mutationFn: (body: ExtractMappingRequest) => setExtractMapping(programId, extractId, body), onSuccess: refresh });
}
