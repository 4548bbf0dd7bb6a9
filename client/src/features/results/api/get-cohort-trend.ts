import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CohortTrendDto } from '@shared/api/results';
import { api } from '@/lib/api-client';

/** One outcome month by month, with the pooled windows. */
export function getCohortTrend(programId: number, outcome: string): Promise<CohortTrendDto> {
  return api.get<CohortTrendDto>(`/programs/${programId}/results/trend`, { outcome });
}

export const getCohortTrendQueryOptions = (programId: number, outcome: string) =>
  queryOptions({ queryKey: ['programs', programId, 'results', 'trend', outcome], queryFn: () => getCohortTrend(programId, outcome) });

export function useCohortTrend(programId: number, outcome: string | null) {
  return useQuery({ ...getCohortTrendQueryOptions(programId, outcome ?? ''), enabled: outcome !== null });
}
