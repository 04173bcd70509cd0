import { Notice } from '../../../components/ui/Notice';
import { SelectField } from '../../../components/ui/SelectField';
import { DELIVERIES, DELIVERY_LABELS, NOTIFICATION_KINDS, NOTIFICATION_LABELS, type Delivery } from '../../../contract/notifications';
import { errorMessage } from '../../../lib/api';
import { useNotificationPrefs, useUpdateNotificationPrefs } from '../api/notificationPrefs';

const OPTIONS = DELIVERIES.map((d) => ({ value: d, label: DELIVERY_LABELS[d] }));

/** Which e-mail notices this person gets, each at once, in the daily digest, or not at all. Saved as each changes. */
export function NotificationChoices() {
  const prefs = useNotificationPrefs();
  const update = useUpdateNotificationPrefs();
  if (prefs.isPending) return <p>Reading your choices…</p>;
  if (prefs.isError)
    return (
      <Notice tone="danger" title="Could not read your choices">
        <p>{errorMessage(prefs.error)}</p>
      </Notice>
    );
  const { digestHourUtc, waiting } = prefs.data;
  return (
    <div className="flex flex-col gap-4">
      <p>
        Each notice can come at once, gathered into one e-mail a day (at {String(digestHourUtc).padStart(2, '0')}:00 UTC), or not at all.
        {waiting > 0 ? ` ${waiting} notice${waiting === 1 ? ' is' : 's are'} waiting for your next digest.` : ''}
      </p>
      {NOTIFICATION_KINDS.map((kind) => (
        <SelectField
          key={kind}
          label={NOTIFICATION_LABELS[kind].label}
          hint={NOTIFICATION_LABELS[kind].hint}
          options={OPTIONS}
          value={prefs.data.prefs[kind]}
          disabled={update.isPending}
          onChange={(e) => update.mutate({ [kind]: e.target.value as Delivery })}
        />
      ))}
      {update.isSuccess ? <p role="status">Saved.</p> : null}
      {update.isError ? (
        <Notice tone="danger" title="Not saved">
          <p>{errorMessage(update.error)}</p>
        </Notice>
      ) : null}
      <p className="text-ink-muted">
        A notice is a reminder, not a call to the crew: on a test day the count and the radio net carry what matters.
      </p>
    </div>
  );
}
