import type { OutgoingMail } from '../mail/mail-delivery';

const FOOTER =
  '\n\nSheathwise supports, and does not replace, the judgement of a competent engineer, the owner\'s standards and local regulations.';

export interface ReviewMessage {
  appUrl: string;
  projectName: string;
  studyCode: string;
  studyTitle: string;
  studyId: string;
  revisionNumber: number;
  siteCode: string;
  version: number;
  reasons: string[];
}

/** Tells a designer or approver that new site data put an issued study back in question. */
export function needsReviewMessage(c: ReviewMessage, to: string): OutgoingMail {
  return {
    to,
    subject: `[Sheathwise] ${c.studyCode} rev ${c.revisionNumber} needs review: new system data at ${c.siteCode}`,
    text:
      `Version ${c.version} of the system data of ${c.siteCode} (${c.projectName}) makes issued revision ${c.revisionNumber} of "${c.studyTitle}" non-conservative:\n\n` +
      c.reasons.map((r) => `- ${r}`).join('\n') +
      `\n\nThe register shows the study as "needs review". Open it to start a revision with the new values: ${c.appUrl}/studies/${c.studyId}${FOOTER}`,
  };
}

export interface DueItem {
  projectName: string;
  assetCode: string;
  assetName: string;
  assetId: string;
  obligation: string;
  dueOn: string;
}

const line = (d: DueItem) => `- ${d.assetCode} (${d.assetName}, ${d.projectName}): ${d.obligation}, due ${d.dueOn}`;

/** A reminder of one obligation at one stage: before it falls due, or once it is overdue. */
export function reminderMessage(appUrl: string, stage: 'due-soon' | 'overdue', d: DueItem, to: string): OutgoingMail {
  const what = stage === 'overdue' ? `overdue since ${d.dueOn}` : `due on ${d.dueOn}`;
  return {
    to,
    subject: `[Sheathwise] ${d.obligation} at ${d.assetCode} is ${what}`,
    text: `${d.obligation} at ${d.assetCode} (${d.assetName}, ${d.projectName}) is ${what} (UTC date).\n\nRecord it with its evidence in the register: ${appUrl}/register?asset=${d.assetId}${FOOTER}`,
  };
}

/** The weekly digest: what is overdue and what falls due soon across a person's projects. */
export function digestMessage(appUrl: string, weekStartOn: string, overdue: DueItem[], dueSoon: DueItem[], reviews: string[], to: string): OutgoingMail {
  const part = (title: string, items: string[]) => (items.length ? `${title}\n${items.join('\n')}\n\n` : '');
  return {
    to,
    subject: `[Sheathwise] Register digest for the week of ${weekStartOn}`,
    text:
      part('Overdue:', overdue.map(line)) +
      part('Due within 30 days:', dueSoon.map(line)) +
      part('Studies needing review:', reviews.map((r) => `- ${r}`)) +
      (overdue.length + dueSoon.length + reviews.length === 0 ? 'Nothing is overdue or due within 30 days, and no study needs review.\n\n' : '') +
      `The register: ${appUrl}/register${FOOTER}`,
  };
}
