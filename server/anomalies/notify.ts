import type { Mailer } from '../mail/mailer';
import { correctiveActionAssignedMail } from '../mail/templates';

export interface NotifyDeps {
  mailer: Mailer;
  appUrl: string;
  log?: (message: string, error?: unknown) => void;
}

export interface AssignmentNotice {
  owner: { name: string; email: string };
  assignedBy: string;
  anomaly: { id: number; ref: string; title: string };
  action: { description: string; dueDate: string };
}

/**
 * Tells the owner of a corrective action it is theirs. The one place to gate this (notification preferences
 * come later). Called after the change has committed; a failed send is logged and never undoes the assignment.
 */
export async function notifyCorrectiveActionAssigned(deps: NotifyDeps, notice: AssignmentNotice): Promise<void> {
  try {
    await deps.mailer.send(
      correctiveActionAssignedMail({
        to: notice.owner.email,
        ownerName: notice.owner.name,
        assignedBy: notice.assignedBy,
        anomalyRef: notice.anomaly.ref,
        anomalyTitle: notice.anomaly.title,
        action: notice.action.description,
        dueDate: notice.action.dueDate,
        link: `${deps.appUrl}/anomalies/${notice.anomaly.id}`,
      }),
    );
  } catch (error) {
    deps.log?.('corrective action e-mail failed', error);
  }
}
