import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export interface UploadEvidenceFileInput {
  hazardId: number;
  mitigationId: number;
  file: File;
  label?: string;
}

/** multipart/form-data: the file in `file`, an optional `label`. The server checks the type from the bytes. */
export function uploadEvidenceFile({ hazardId, mitigationId, file, label }: UploadEvidenceFileInput) {
  const form = new FormData();
  if (label?.trim()) form.append('label', label.trim());
  form.append('file', file, file.name);
  return api.post<HazardDto>(`/api/hazards/${hazardId}/mitigations/${mitigationId}/evidence/files`, form);
}

export function useUploadEvidenceFile() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: uploadEvidenceFile,
    onSuccess: (hazard) => {
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.all });
    },
  });
}
