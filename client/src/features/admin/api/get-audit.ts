import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEventDto } from '@shared/api/audit';
import type { ListDto } from '@shared/api/programs';
import type { AuditAction } from '@shared/schemas/audit';
import { api } from '@/lib/api-client';

export interface AuditFilters {
  page: number;
  action?: AuditAction;
  from?: string;
  to?: string;
}

export const getAuditQueryOptions = (filters: AuditFilters) =>
  queryOptions({
    queryKey: ['admin', 'audit', filters],
    queryFn: () => api.get<ListDto<AuditEventDto>>('/admin/audit', { ...filters, pageSize: 50 }),
    placeholderData: (previous) => previous,
  });

export function useAuditTrail(filters: AuditFilters) {
  return useQuery(getAuditQueryOptions(filters));
}
