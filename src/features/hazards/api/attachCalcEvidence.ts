import { useMutation, useQueryClient } from '@tanstack/react-query';
import { evidenceInputSchema, type EvidenceInput, type HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export { evidenceInputSchema, type EvidenceInput };

/** The server runs the calculator again with these inputs and freezes inputs, outputs and the date. */
export function attachCalcEvidence({ hazardId, input }: { hazardId: number; input: EvidenceInput }) {
  return api.post<HazardDto>(`/api/hazards/${hazardId}/evidence`, input);
}

export function useAttachCalcEvidence() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: attachCalcEvidence,
    onSuccess: (hazard) => {
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.all });
    },
  });
}
