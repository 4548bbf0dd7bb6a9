import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DataSourceDto, IngestSettingsDto } from '@shared/api/extracts';
import { api } from '@/lib/api-client';

export function getDataSources(programId: number): Promise<DataSourceDto[]> {
  return api.get<DataSourceDto[]>(`/programs/${programId}/data-sources`);
}

export const getDataSourcesQueryOptions = (programId: number) =>
  queryOptions({ queryKey: ['programs', programId, 'data-sources'], queryFn: () => getDataSources(programId) });

export function useDataSources(programId: number) {
  return useQuery(getDataSourcesQueryOptions(programId));
}

export function getIngestSettings(programId: number): Promise<IngestSettingsDto> {
  return api.get<IngestSettingsDto>(`/programs/${programId}/ingest-settings`);
}

export const getIngestSettingsQueryOptions = (programId: number) =>
  queryOptions({ queryKey: ['programs', programId, 'ingest-settings'], queryFn: () => getIngestSettings(programId) });

export function useIngestSettings(programId: number) {
  return useQuery(getIngestSettingsQueryOptions(programId));
}
