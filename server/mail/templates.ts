import type { CountPlan } from '../../src/domain/count/events';
import { ROLE_LABELS, type Role } from '../../src/domain/people/roles';
import type { OutgoingMail } from './mailer';

const SIGNATURE = '\n\n-- \nHoldfire: planning and record aid for engine test teams.\nIf you did not expect this message, you can ignore it.';

export function invitationMail(args: {
  to: string;
  teamName: string;
  invitedBy: string;
  roles: Role[];
  link: string;
  expiresAt: Date;
}): OutgoingMail {
  const roles = args.roles.map((r) => ROLE_LABELS[r]).join(', ');
  return {
    to: args.to,
    subject: `You are invited to ${args.teamName} on Holdfire`,
    text:
      `${args.invitedBy} invited you to join ${args.teamName} on Holdfire as: ${roles}.\n\n` +
      `Set your name and password here (the link works once, until ${args.expiresAt.toUTCString()}):\n${args.link}` +
      SIGNATURE,
  };
}

export function passwordResetMail(args: { to: string; link: string; expiresAt: Date }): OutgoingMail {
  return {
    to: args.to,
    subject: 'Reset your Holdfire password',
    text:
      `Someone asked to reset the Holdfire password for ${args.to}.\n\n` +
      `Choose a new password here (the link works once, until ${args.expiresAt.toUTCString()}):\n${args.link}` +
      SIGNATURE,
  };
}

export function scrubNoticeMail(args: {
  to: string[];
  countName: string;
  category: string;
  reason: string;
  scrubbedBy: string;
  at: Date;
  tMinus: string;
  link: string;
}): OutgoingMail {
  return {
    to: args.to,
    subject: `Scrubbed: ${args.countName}`,
    text:
      `${args.countName} was scrubbed at ${args.tMinus} (${args.at.toUTCString()}) by ${args.scrubbedBy}.\n\n` +
      `Category: ${args.category}\nReason: ${args.reason}\n\n` +
      'The count has moved to its safing steps. Follow the test conductor and the safety officer on the radio: their calls govern, ' +
      'not this message. Stay out of the keep-out area until the stand is declared safe.\n\n' +
      `Follow the count: ${args.link}` +
      SIGNATURE,
  };
}

/** The count report in words, to the crew when safing is closed and the count has ended. */
export function countReportMail(args: {
  to: string[];
  countName: string;
  lines: string[];
  lastHash: string | null;
  link: string;
}): OutgoingMail {
  return {
    to: args.to,
    subject: `Count report: ${args.countName}`,
    text:
      `${args.countName} has ended. What the count log records:\n\n` +
      args.lines.map((l) => `- ${l}`).join('\n') +
      `\n\nThe log's last hash: ${args.lastHash ?? '(none)'}. Keep this message: an export of the same log must end in the same hash.\n\n` +
      `The full report, printable: ${args.link}` +
      SIGNATURE,
  };
}

/** To one crew member when a count is created: their station(s), when to report, the window, the link. */
export function countScheduledNotice(args: {
  plan: Pick<CountPlan, 'name' | 'crew' | 'revisionNumber'>;
  userId: number;
  conductor: string;
  reportAt: number | null;
  windowEnd: number | null;
  link: string;
}): { subject: string; text: string } {
  const stations = args.plan.crew.filter((c) => c.userIds.includes(args.userId)).map((c) => c.station);
  const when = (ms: number) => `${new Date(ms).toISOString().slice(0, 16).replace('T', ' ')} UTC`;
  return {
    subject: `On the crew: ${args.plan.name}${args.reportAt !== null ? `, report ${when(args.reportAt)}` : ''}`,
    text: [
      `${args.conductor} has put you on the crew of "${args.plan.name}" (procedure revision ${args.plan.revisionNumber}).`,
      `Your station${stations.length === 1 ? '' : 's'}: ${stations.join(', ') || 'none named'}.`,
      args.reportAt !== null ? `Report at: ${when(args.reportAt)}.` : 'The test conductor will tell you when to report.',
      args.windowEnd !== null ? `The firing window ends at ${when(args.windowEnd)}.` : null,
      `Read the procedure for your station before the day, and bring the PPE it lists. The count: ${args.link}`,
    ]
      .filter((l) => l !== null)
      .join('\n'),
  };
}

/** A corrective action of an anomaly, to the person who now owns it. */
export function correctiveActionAssignedMail(args: {
  to: string;
  ownerName: string;
  assignedBy: string;
  anomalyRef: string;
  anomalyTitle: string;
  action: string;
  dueDate: string;
  link: string;
}): OutgoingMail {
  return {
    to: args.to,
    subject: `Corrective action for ${args.anomalyRef}: due ${args.dueDate}`,
    text:
      `${args.ownerName}, ${args.assignedBy} made you the owner of a corrective action for anomaly ${args.anomalyRef} ` +
      `(${args.anomalyTitle}).\n\nTo do: ${args.action}\nDue: ${args.dueDate}\n\n` +
      'Mark it in progress or done on the anomaly page; the anomaly cannot be closed while it is not done.\n\n' +
      `The anomaly: ${args.link}` +
      SIGNATURE,
  };
}
