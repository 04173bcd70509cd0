import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { NotificationPrefsDto, NotificationPrefsInput } from '../../../contract/notifications';
import { api } from '../../../lib/api';

export const notificationKeys = { prefs: () => ['profile', 'notifications'] as const };

export function getNotificationPrefs(signal?: AbortSignal) {
  return api.get<NotificationPrefsDto>('/api/profile/notifications', { signal });
}

export const notificationPrefsQueryOptions = () =>
  queryOptions({ queryKey: notificationKeys.prefs(), queryFn: ({ signal }) => getNotificationPrefs(signal) });

export function useNotificationPrefs() {
  return useQuery(notificationPrefsQueryOptions());
}

export function updateNotificationPrefs(input: NotificationPrefsInput) {
  return api.put<NotificationPrefsDto>('/api/profile/notifications', input);
}

export function useUpdateNotificationPrefs() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateNotificationPrefs,
    onSuccess: (dto) => client.setQueryData(notificationKeys.prefs(), dto),
  });
}
