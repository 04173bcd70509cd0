import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LessonDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

/** Opens a draft revision of the procedure because of the anomaly, or links the draft already open. */
export function openLesson({ id, procedureId }: { id: number; procedureId: number }) {
  return api.post<LessonDto>(`/api/anomalies/${id}/lessons`, { procedureId });
}

export function useOpenLesson() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: openLesson,
    onSuccess: (lesson) => {
      client.setQueryData(anomalyKeys.detail(lesson.anomaly.id), lesson.anomaly);
      void client.invalidateQueries({ queryKey: anomalyKeys.lists() });
      // The procedure pages show the new draft.
      void client.invalidateQueries({ queryKey: ['procedures'] });
    },
  });
}
