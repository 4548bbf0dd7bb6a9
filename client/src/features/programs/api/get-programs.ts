import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto, ProgramSummaryDto } from '@shared/api/programs';
import { api } from '@/lib/api-client';

export function getPrograms(page = 1): Promise<ListDto<ProgramSummaryDto>> {
  return api.get<ListDto<ProgramSummaryDto>>('/programs', { page });
}

export const getProgramsQueryOptions = (page = 1) =>
  queryOptions({ queryKey: ['programs', { page }], queryFn: () => getPrograms(page) });

export function usePrograms(page = 1) {
  return useQuery(getProgramsQueryOptions(page));
}
