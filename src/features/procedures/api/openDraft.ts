import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RevisionDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

/** Opens the next draft as a copy of the latest revision. */
export function openDraft(procedureId: number) {
  return api.post<RevisionDto>(`/api/procedures/${procedureId}/revisions`);
}

export function useOpenDraft() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: openDraft,
    onSuccess: (rev) => {
      client.setQueryData(procedureKeys.revision(rev.procedureId, rev.number), rev);
      void client.invalidateQueries({ queryKey: procedureKeys.detail(rev.procedureId) });
      void client.invalidateQueries({ queryKey: procedureKeys.lists() });
    },
  });
}
