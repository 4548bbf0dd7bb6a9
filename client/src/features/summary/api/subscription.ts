import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { SubscriptionDto } from '@shared/api/mail';
import type { SubscriptionUpdateInput } from '@shared/schemas/subscription';
import { api } from '@/lib/api-client';

export const getSubscriptionQueryOptions = () => queryOptions({ queryKey: ['me', 'subscription'], queryFn: () => api.get<SubscriptionDto>('/me/subscription') });

export const useSubscription = () => useQuery(getSubscriptionQueryOptions());

export function useUpdateSubscription() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SubscriptionUpdateInput) => api.put<SubscriptionDto>('/me/subscription', input),
    onSuccess: (data) => qc.setQueryData(getSubscriptionQueryOptions().queryKey, data),
  });
}
