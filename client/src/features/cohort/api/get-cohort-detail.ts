import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CohortDetailDto } from '@shared/api/results';
import { api } from '@/lib/api-client';

/** One month: every outcome's estimates, diagnostics, caveats (with acknowledgements) and plot bins. */
export function getCohortDetail(programId: number, period: string): Promise<CohortDetailDto> {
  return api.get<CohortDetailDto>(`/programs/${programId}/results/cohorts/${period}`);
}

export const getCohortDetailQueryOptions = (programId: number, period: string) =>
  queryOptions({ queryKey: ['programs', programId, 'results', 'cohorts', period], queryFn: () => getCohortDetail(programId, period) });

export function useCohortDetail(programId: number, period: string) {
  return useQuery(getCohortDetailQueryOptions(programId, period));
}
