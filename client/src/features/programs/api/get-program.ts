import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProgramDetailDto } from '@shared/api/programs';
import { api } from '@/lib/api-client';

/** One program with its cutoff schedule and outcome and covariate definitions. */
export function getProgram(programId: number): Promise<ProgramDetailDto> {
  return api.get<ProgramDetailDto>(`/programs/${programId}`);
}

export const getProgramQueryOptions = (programId: number) => queryOptions({ queryKey: ['programs', programId], queryFn: () => getProgram(programId) });

export function useProgram(programId: number) {
  return useQuery(getProgramQueryOptions(programId));
}
