import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { DesignComparisonDto, DesignDetailDto, DesignDto } from '@shared/api/designs';
import type { ProgramDetailDto } from '@shared/api/programs';
import type { DesignCreateInput, DesignLockInput, DesignVersionCreateInput } from '@shared/schemas/design';
import { api } from '@/lib/api-client';

export const getDesignsQueryOptions = (programId: number) =>
  queryOptions({
    queryKey: ['programs', programId, 'designs'],
    queryFn: () => api.get<{ items: DesignDto[] }>(`/programs/${programId}/designs`).then((r) => r.items),
  });

export const useDesigns = (programId: number) => useQuery(getDesignsQueryOptions(programId));

export const getDesignQueryOptions = (programId: number, designId: number) =>
  queryOptions({
    queryKey: ['programs', programId, 'designs', designId],
    queryFn: () => api.get<DesignDetailDto>(`/programs/${programId}/designs/${designId}`),
  });

export const useDesign = (programId: number, designId: number) => useQuery(getDesignQueryOptions(programId, designId));

export const useDesignComparison = (programId: number, designId: number, from: number, to: number) =>
  useQuery({
    queryKey: ['programs', programId, 'designs', designId, 'compare', { from, to }],
    queryFn: () => api.get<DesignComparisonDto>(`/programs/${programId}/designs/${designId}/compare`, { from, to }),
    enabled: from > 0 && to > 0 && from !== to,
  });

export const useProgramDetail = (programId: number) =>
  useQuery({ queryKey: ['programs', programId, 'detail'], queryFn: () => api.get<ProgramDetailDto>(`/programs/${programId}`) });

function useInvalidateDesigns(programId: number) {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: getDesignsQueryOptions(programId).queryKey });
}

export function useCreateDesign(programId: number) {
  const invalidate = useInvalidateDesigns(programId);
  return useMutation({ mutationFn: (input: DesignCreateInput) => api.post<DesignDetailDto>(`/programs/${programId}/designs`, input), onSuccess: invalidate });
}

export function useCreateDesignVersion(programId: number, designId: number) {
  const invalidate = useInvalidateDesigns(programId);
  return useMutation({
    mutationFn: (input: DesignVersionCreateInput) => api.post<DesignDetailDto>(`/programs/${programId}/designs/${designId}/versions`, input),
    onSuccess: invalidate,
  });
}

export function useLockDesign(programId: number, designId: number) {
  const invalidate = useInvalidateDesigns(programId);
  return useMutation({ mutationFn: (input: DesignLockInput) => api.post<DesignDetailDto>(`/programs/${programId}/designs/${designId}/lock`, input), onSuccess: invalidate });
}

export function useMakePrimary(programId: number, designId: number) {
  const invalidate = useInvalidateDesigns(programId);
  return useMutation({ mutationFn: () => api.patch<DesignDetailDto>(`/programs/${programId}/designs/${designId}`, { primary: true }), onSuccess: invalidate });
}
