import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ResultsOverviewDto } from '@shared/api/results';
import { api } from '@/lib/api-client';

/** The latest results of a program's primary design (every role of the program may read them). */
export function getResultsOverview(programId: number): Promise<ResultsOverviewDto> {
  return api.get<ResultsOverviewDto>(`/programs/${programId}/results`);
}

export const getResultsOverviewQueryOptions = (programId: number) =>
  queryOptions({ queryKey: ['programs', programId, 'results'], queryFn: () => getResultsOverview(programId) });

export function useResultsOverview(programId: number) {
  return useQuery(getResultsOverviewQueryOptions(programId));
}
