import { useMutation, useQueryClient } from '@tanstack/react-query';
import { procedureCreateInputSchema, type ProcedureCreateInput, type ProcedureDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export { procedureCreateInputSchema, type ProcedureCreateInput };

export function createProcedure(input: ProcedureCreateInput) {
  return api.post<ProcedureDto>('/api/procedures', input);
}

export function useCreateProcedure() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createProcedure,
    onSuccess: (p) => {
      client.setQueryData(procedureKeys.detail(p.id), p);
      void client.invalidateQueries({ queryKey: procedureKeys.lists() });
    },
  });
}
