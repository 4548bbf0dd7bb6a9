import { useQuery } from '@tanstack/react-query';
import type { EmailMessageDetailDto, EmailMessageDto } from '@shared/api/mail';
import type { ListDto } from '@shared/api/programs';
import { api } from '@/lib/api-client';

export const useSentMail = (page: number) =>
  useQuery({ queryKey: ['admin', 'mail', { page }], queryFn: () => api.get<ListDto<EmailMessageDto>>('/admin/mail', { page, pageSize: 25 }) });

export const useSentMessage = (id: number) =>
  useQuery({ queryKey: ['admin', 'mail', id], queryFn: () => api.get<EmailMessageDetailDto>(`/admin/mail/${id}`) });
