import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

export interface UploadAnomalyFileInput {
  id: number;
  file: File;
  caption?: string;
}

/** multipart/form-data: the file in `file`, an optional `caption`. The server checks the type from the bytes. */
export function uploadAnomalyFile({ id, file, caption }: UploadAnomalyFileInput) {
  const form = new FormData();
  if (caption?.trim()) form.append('caption', caption.trim());
  form.append('file', file, file.name);
  return api.post<AnomalyDto>(`/api/anomalies/${id}/attachments`, form);
}

export function useUploadAnomalyFile() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: uploadAnomalyFile,
    onSuccess: (anomaly) => client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly),
  });
}
