import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RevisionSaveDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export function removeAttachment({ procedureId, rev, attachmentId }: { procedureId: number; rev: number; attachmentId: number }) {
  return api.delete<RevisionSaveDto>(`/api/procedures/${procedureId}/revisions/${rev}/attachments/${attachmentId}`);
}

export function useRemoveAttachment() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: removeAttachment,
    onSuccess: (saved) => {
      client.setQueryData(procedureKeys.revision(saved.procedureId, saved.number), saved);
      void client.invalidateQueries({ queryKey: procedureKeys.detail(saved.procedureId) });
    },
  });
}
