import { useMutation, useQueryClient } from '@tanstack/react-query';
import { countCreateInputSchema, type CountCreateInput, type CountDetailDto } from '../../../contract/count';
import { api } from '../../../lib/api';
import { countKeys } from './keys';

export { countCreateInputSchema };

export function createCount(input: CountCreateInput) {
  return api.post<CountDetailDto>('/api/counts', countCreateInputSchema.parse(input));
}

export function useCreateCount() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createCount,
    onSuccess: (count) => {
      client.setQueryData(countKeys.detail(count.id), count);
      void client.invalidateQueries({ queryKey: countKeys.lists() });
    },
  });
}
