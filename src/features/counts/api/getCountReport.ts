import { useQuery } from '@tanstack/react-query';
import type { CountReport } from '../../../domain/count/report';
import { api } from '../../../lib/api';
import { countKeys } from './keys';

export type CountReportDto = CountReport & { countId: number; countName: string };

export function useCountReport(id: number) {
  return useQuery({ queryKey: [...countKeys.detail(id), 'report'], queryFn: ({ signal }) => api.get<CountReportDto>(`/api/counts/${id}/report`, { signal }) });
}
