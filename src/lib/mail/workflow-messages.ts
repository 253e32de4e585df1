import type { OutgoingMail } from './mail-delivery';

export interface MessageContext {
  appUrl: string;
  projectName: string;
  studyTitle: string;
  revisionNumber: number;
  revisionId: string;
  actorName: string;
  reason?: string;
}

const FOOTER =
  '\n\nSheathwise results support, and do not replace, the judgement of a competent engineer, the owner\'s standards and local regulations.';

const link = (c: MessageContext) => `${c.appUrl}/revisions/${c.revisionId}`;
const subjectOf = (c: MessageContext, what: string) => `[Sheathwise] ${c.studyTitle} rev ${c.revisionNumber}: ${what}`;

/** The message a workflow step sends, per recipient. */
export function workflowMessage(kind: 'submitted' | 'returned' | 'checked' | 'issued' | 'remark', c: MessageContext, to: string): OutgoingMail {
  const body: Record<typeof kind, [string, string]> = {
    submitted: ['ready for your check', `${c.actorName} has submitted revision ${c.revisionNumber} of "${c.studyTitle}" (${c.projectName}) for an independent check.`],
    returned: ['returned to you', `${c.actorName} has returned revision ${c.revisionNumber} of "${c.studyTitle}" (${c.projectName}).\n\nReason: ${c.reason ?? '(see the remarks)'}`],
    checked: ['checked, waiting for approval', `${c.actorName} has checked revision ${c.revisionNumber} of "${c.studyTitle}" (${c.projectName}). It is waiting for an approver.`],
    issued: ['issued', `${c.actorName} has approved and issued revision ${c.revisionNumber} of "${c.studyTitle}" (${c.projectName}).`],
    remark: ['new remark', `${c.actorName} wrote a remark on revision ${c.revisionNumber} of "${c.studyTitle}" (${c.projectName}):\n\n${c.reason ?? ''}`],
  };
  const [what, text] = body[kind];
  return { to, subject: subjectOf(c, what), text: `${text}\n\nOpen it: ${link(c)}${FOOTER}` };
}

/** Tells an approver that the issued record could not be rendered, and what to do. */
export function recordFailedMessage(c: MessageContext, to: string): OutgoingMail {
  return {
    to,
    subject: subjectOf(c, 'the issued record could not be rendered'),
    text: `The record of revision ${c.revisionNumber} of "${c.studyTitle}" (${c.projectName}) was issued, but rendering its document failed:\n\n${c.reason ?? ''}\n\nThe revision stays issued and unchanged. Once the cause is fixed, open it and choose "Render the record again": ${link(c)}${FOOTER}`,
  };
}

export function invitationMessage(appUrl: string, to: string, name: string, token: string, invitedBy: string, expiresAt: Date): OutgoingMail {
  return {
    to,
    subject: '[Sheathwise] You are invited',
    text:
      `Hello ${name},\n\n${invitedBy} has invited you to Sheathwise. Choose your password here (the link works once, until ${expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC):\n\n` +
      `${appUrl}/invitation/${token}\n\nIf you did not expect this, ignore this message.`,
  };
}
