import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RejectedRowDto } from '@shared/api/extracts';
import type { ListDto } from '@shared/api/programs';
import { api } from '@/lib/api-client';

export function getRejectedRows(programId: number, extractId: number, page: number, pageSize: number): Promise<ListDto<RejectedRowDto>> {
  return api.get<ListDto<RejectedRowDto>>(`/programs/${programId}/extracts/${extractId}/rejected-rows`, { page, pageSize });
}

export const getRejectedRowsQueryOptions = (programId: number, extractId: number, page = 1, pageSize = 25) =>
  queryOptions({
    queryKey: ['programs', programId, 'extracts', 'detail', extractId, 'rejected-rows', { page, pageSize }],
    queryFn: () => getRejectedRows(programId, extractId, page, pageSize),
  });

export function useRejectedRows(programId: number, extractId: number, page: number, pageSize: number, enabled: boolean) {
  return useQuery({ ...getRejectedRowsQueryOptions(programId, extractId, page, pageSize), enabled, placeholderData: keepPreviousData });
}

/** Where the browser downloads rejected.csv (a plain link: the session cookie goes with it). */
export const rejectedCsvHref = (programId: number, extractId: number) => `/api/programs/${programId}/extracts/${extractId}/rejected.csv`;
