import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { mailMessageSchema } from '../../../contract/people';
import { api } from '../../../lib/api';

export const mailKeys = {
  all: ['mail'] as const,
  outbox: () => ['mail', 'outbox'] as const,
};

/** Newest first; the server already sorts, sorting again keeps the page right if it ever does not. */
export async function fetchOutbox(signal?: AbortSignal) {
  const messages = await api.get('/api/mail/outbox', { schema: z.array(mailMessageSchema), signal });
  return [...messages].sort((a, b) => Date.parse(b.sentAt) - Date.parse(a.sentAt));
}

export function outboxQueryOptions() {
  return queryOptions({ queryKey: mailKeys.outbox(), queryFn: ({ signal }) => fetchOutbox(signal), staleTime: 5_000 });
}

export function useOutbox() {
  return useQuery(outboxQueryOptions());
}
