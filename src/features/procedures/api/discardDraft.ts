import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProcedureDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export function discardDraft({ procedureId, rev }: { procedureId: number; rev: number }) {
  return api.delete<ProcedureDto>(`/api/procedures/${procedureId}/revisions/${rev}`);
}

export function useDiscardDraft() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: discardDraft,
    onSuccess: (p, { rev }) => {
      client.removeQueries({ queryKey: procedureKeys.revision(p.id, rev) });
      client.setQueryData(procedureKeys.detail(p.id), p);
      void client.invalidateQueries({ queryKey: procedureKeys.all });
    },
  });
}
