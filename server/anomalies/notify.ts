import type { Notifier } from '../mail/notify';
import { correctiveActionAssignedMail } from '../mail/templates';

export interface NotifyDeps {
  notifier: Notifier;
  appUrl: string;
  log?: (message: string, error?: unknown) => void;
}

export interface AssignmentNotice {
  owner: { id: number; name: string; email: string };
  assignedBy: string;
  anomaly: { id: number; ref: string; title: string };
  action: { description: string; dueDate: string };
}

/**
 * Tells the owner of a corrective action it is theirs, as they chose for the 'action-assigned' notice (at once, in
 * the daily digest, or not at all). Called after the change has committed; a failed send is logged and never undoes
 * the assignment.
 */
export async function notifyCorrectiveActionAssigned(deps: NotifyDeps, notice: AssignmentNotice): Promise<void> {
  try {
    const mail = correctiveActionAssignedMail({
      to: notice.owner.email,
      ownerName: notice.owner.name,
      assignedBy: notice.assignedBy,
      anomalyRef: notice.anomaly.ref,
      anomalyTitle: notice.anomaly.title,
      action: notice.action.description,
      dueDate: notice.action.dueDate,
      link: `${deps.appUrl}/anomalies/${notice.anomaly.id}`,
    });
    await deps.notifier.deliver('action-assigned', [notice.owner.id], () => mail);
  } catch (error) {
    deps.log?.('corrective action e-mail failed', error);
  }
}
