import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProgramDetailDto } from '@shared/api/programs';
import type { ProgramInput } from '@shared/schemas/program';
import type { CovariateDefinitionsInput, CutoffScheduleInput, OutcomeDefinitionsInput, ProgramCreateInput } from '@shared/schemas/program-admin';
import { api } from '@/lib/api-client';

/** Administrators' changes to programs; each invalidates every program query (list, detail, results). */

export const createProgram = (input: ProgramCreateInput) => api.post<ProgramDetailDto>('/admin/programs', input);
export const updateProgram = (programId: number, input: ProgramInput) => api.put<ProgramDetailDto>(`/programs/${programId}`, input);
export const replaceCutoffSchedule = (programId: number, input: CutoffScheduleInput) => api.put<ProgramDetailDto>(`/programs/${programId}/cutoff-schedule`, input);
export const replaceOutcomes = (programId: number, input: OutcomeDefinitionsInput) => api.put<ProgramDetailDto>(`/programs/${programId}/outcomes`, input);
export const replaceCovariates = (programId: number, input: CovariateDefinitionsInput) => api.put<ProgramDetailDto>(`/programs/${programId}/covariates`, input);

function useProgramMutation<I>(fn: (input: I) => Promise<ProgramDetailDto>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => queryClient.invalidateQueries({ queryKey: ['programs'] }) });
}

export const useCreateProgram = () => useProgramMutation(createProgram);
export const useUpdateProgram = (programId: number) => useProgramMutation((i: ProgramInput) => updateProgram(programId, i));
export const useReplaceCutoffSchedule = (programId: number) => useProgramMutation((i: CutoffScheduleInput) => replaceCutoffSchedule(programId, i));
export const useReplaceOutcomes = (programId: number) => useProgramMutation((i: OutcomeDefinitionsInput) => replaceOutcomes(programId, i));
export const useReplaceCovariates = (programId: number) => useProgramMutation((i: CovariateDefinitionsInput) => replaceCovariates(programId, i));
