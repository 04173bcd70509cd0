import { useMutation, useQueryClient } from '@tanstack/react-query';
import { revisionContentInputSchema, type RevisionContentInput, type RevisionSaveDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { crewPlanKeys, procedureKeys } from './keys';

export { revisionContentInputSchema, type RevisionContentInput };

export function saveDraft({ procedureId, rev, content }: { procedureId: number; rev: number; content: RevisionContentInput }) {
  return api.put<RevisionSaveDto>(`/api/procedures/${procedureId}/revisions/${rev}`, content);
}

export function useSaveDraft() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: saveDraft,
    onSuccess: (saved) => {
      client.setQueryData(procedureKeys.revision(saved.procedureId, saved.number), saved);
      // Sign-offs may have been cleared, and diffs against this draft are stale.
      void client.invalidateQueries({ queryKey: procedureKeys.detail(saved.procedureId) });
      void client.invalidateQueries({ queryKey: procedureKeys.lists() });
      // The stations a draft needs feed the crew manning check.
      void client.invalidateQueries({ queryKey: crewPlanKeys.all });
    },
  });
}
