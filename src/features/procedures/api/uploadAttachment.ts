import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RevisionSaveDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export interface UploadAttachmentInput {
  procedureId: number;
  rev: number;
  file: File;
  caption?: string;
  /** A step's key, or null for the whole procedure. */
  stepKey: string | null;
}

/** multipart/form-data: the file in `file`, optional `caption` and `stepKey`. The server checks the type from the bytes. */
export function uploadAttachment({ procedureId, rev, file, caption, stepKey }: UploadAttachmentInput) {
  const form = new FormData();
  if (caption?.trim()) form.append('caption', caption.trim());
  if (stepKey) form.append('stepKey', stepKey);
  form.append('file', file, file.name);
  return api.post<RevisionSaveDto>(`/api/procedures/${procedureId}/revisions/${rev}/attachments`, form);
}

export function useUploadAttachment() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: uploadAttachment,
    onSuccess: (saved) => {
      client.setQueryData(procedureKeys.revision(saved.procedureId, saved.number), saved);
      // Sign-offs on the draft may have been withdrawn.
      void client.invalidateQueries({ queryKey: procedureKeys.detail(saved.procedureId) });
    },
  });
}
