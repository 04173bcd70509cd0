import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RevisionDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export function fetchRevision(id: number, rev: number, signal?: AbortSignal) {
  return api.get<RevisionDto>(`/api/procedures/${id}/revisions/${rev}`, { signal });
}

export function revisionQueryOptions(id: number, rev: number) {
  return queryOptions({ queryKey: procedureKeys.revision(id, rev), queryFn: ({ signal }) => fetchRevision(id, rev, signal) });
}

export function useRevision(id: number, rev: number, options: { enabled?: boolean } = {}) {
  return useQuery({ ...revisionQueryOptions(id, rev), enabled: options.enabled ?? true });
}

/** Where a revision's exchange file downloads from (the server names the file). */
export function revisionExportUrl(id: number, rev: number): string {
  return `/api/procedures/${id}/revisions/${rev}/export`;
}
