import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProcedureDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

/** Sends a parsed exchange file as it is: the server checks it whole and lists every problem at once. */
export function importProcedure(document: Record<string, unknown>) {
  return api.post<ProcedureDto>('/api/procedures/import', document);
}

export function useImportProcedure() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: importProcedure,
    onSuccess: (p) => {
      client.setQueryData(procedureKeys.detail(p.id), p);
      void client.invalidateQueries({ queryKey: procedureKeys.lists() });
    },
  });
}
