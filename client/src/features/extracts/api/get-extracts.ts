import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ExtractSummaryDto } from '@shared/api/extracts';
import type { ListDto } from '@shared/api/programs';
import { EXTRACT_BUSY_STATUSES, type ExtractStatus } from '@shared/schemas/extract';
import { api } from '@/lib/api-client';

export interface ExtractListParams {
  page: number;
  pageSize: number;
  status?: ExtractStatus;
}

export function getExtracts(programId: number, params: ExtractListParams): Promise<ListDto<ExtractSummaryDto>> {
  return api.get<ListDto<ExtractSummaryDto>>(`/programs/${programId}/extracts`, { page: params.page, pageSize: params.pageSize, status: params.status });
}

export const getExtractsQueryOptions = (programId: number, params: ExtractListParams = { page: 1, pageSize: 20 }) =>
  queryOptions({ queryKey: ['programs', programId, 'extracts', params], queryFn: () => getExtracts(programId, params) });

/** The list, refreshed every 2 s while any listed extract is being checked or loaded. */
export function useExtracts(programId: number, params: ExtractListParams) {
  return useQuery({
    ...getExtractsQueryOptions(programId, params),
    placeholderData: keepPreviousData,
    refetchInterval: (query) => (query.state.data?.items.some((e) => EXTRACT_BUSY_STATUSES.includes(e.status)) ? 2000 : false),
  });
}
