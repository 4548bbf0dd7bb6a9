import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { ExtractUploadResultDto } from '@shared/api/extracts';
import { api } from '@/lib/api-client';
import { getExtractsQueryOptions } from './get-extracts';

export interface UploadInput {
  file: File;
  period: string;
  sourceId?: number;
  sheet?: string;
  reviewMapping: boolean;
}

export function uploadExtract(programId: number, input: UploadInput, onProgress: (sent: number, total: number) => void): Promise<ExtractUploadResultDto> {
  const form = new FormData();
  // Fields first: the server reads them before the file streams to disk.
  form.set('period', input.period);
  if (input.sourceId) form.set('sourceId', String(input.sourceId));
  if (input.sheet) form.set('sheet', input.sheet);
  if (input.reviewMapping) form.set('reviewMapping', 'true');
  form.set('file', input.file, input.file.name);
  return api.upload<ExtractUploadResultDto>(`/programs/${programId}/extracts`, form, onProgress);
}

/** Uploads one file and reports the transfer as it goes ({ sent, total } in bytes). */
export function useUploadExtract(programId: number) {
  const queryClient = useQueryClient();
  const [transfer, setTransfer] = useState<{ sent: number; total: number } | null>(null);
  const mutation = useMutation({
    mutationFn: (input: UploadInput) => {
      setTransfer({ sent: 0, total: input.file.size });
      return uploadExtract(programId, input, (sent, total) => setTransfer({ sent, total: total || input.file.size }));
    },
    onSettled: () => {
      setTransfer(null);
      void queryClient.invalidateQueries({ queryKey: getExtractsQueryOptions(programId).queryKey.slice(0, 3) });
    },
  });
  return { ...mutation, transfer };
}
