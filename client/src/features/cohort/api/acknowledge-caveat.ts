import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CaveatAcknowledgementDto } from '@shared/api/results';
import type { CaveatAcknowledgeInput } from '@shared/schemas/caveat-acknowledgement';
import { api } from '@/lib/api-client';
import { getCohortDetailQueryOptions } from './get-cohort-detail';

/** A manager acknowledges a caveat of one result, with a comment (recorded in the audit trail). */
export function acknowledgeCaveat(programId: number, resultId: number, input: CaveatAcknowledgeInput): Promise<CaveatAcknowledgementDto> {
  return api.post<CaveatAcknowledgementDto>(`/programs/${programId}/results/${resultId}/acknowledgements`, input);
}

/** Invalidates the month's detail, which lists the acknowledgements. */
export function useAcknowledgeCaveat(programId: number, period: string, resultId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CaveatAcknowledgeInput) => acknowledgeCaveat(programId, resultId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getCohortDetailQueryOptions(programId, period).queryKey }),
  });
}
