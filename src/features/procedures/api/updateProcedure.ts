import { useMutation, useQueryClient } from '@tanstack/react-query';
import { procedureUpdateInputSchema, type ProcedureDto, type ProcedureUpdateInput } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export { procedureUpdateInputSchema, type ProcedureUpdateInput };

export function updateProcedure({ id, input }: { id: number; input: ProcedureUpdateInput }) {
  return api.patch<ProcedureDto>(`/api/procedures/${id}`, input);
}

export function useUpdateProcedure() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateProcedure,
    onSuccess: (p) => {
      client.setQueryData(procedureKeys.detail(p.id), p);
      void client.invalidateQueries({ queryKey: procedureKeys.all });
    },
  });
}
