import { useMutation, useQueryClient } from '@tanstack/react-query';
import { signoffInputSchema, type RevisionDto, type SignoffRole } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export { signoffInputSchema };

export function signRevision({ procedureId, rev, as }: { procedureId: number; rev: number; as: SignoffRole }) {
  return api.post<RevisionDto>(`/api/procedures/${procedureId}/revisions/${rev}/signoffs`, signoffInputSchema.parse({ as }));
}

export function useSignRevision() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: signRevision,
    onSuccess: (rev) => {
      client.setQueryData(procedureKeys.revision(rev.procedureId, rev.number), rev);
      // A release changes which revision can be counted and what the list shows.
      void client.invalidateQueries({ queryKey: procedureKeys.detail(rev.procedureId) });
      void client.invalidateQueries({ queryKey: procedureKeys.lists() });
    },
  });
}
