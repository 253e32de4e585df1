// Audit and workflow events told as sentences ("Bram Lindqvist took revision 1 of B10 for
// checking"), for the history tab, the audit browser and the record. Stored types stay
// technical; people read these.

import { formatNumber } from '../format';
import { itemKeyLabel } from '../compare/labels';

export interface EventForWords {
  type: string;
  actorName?: string | null;
  detail?: unknown;
  /** The study code and revision number the event concerns, where known. */
  studyCode?: string | null;
  revisionNumber?: number | null;
}

const STEP_WORDS: Record<string, string> = {
  'revision.submit': 'submitted {rev} for checking',
  'revision.startCheck': 'took {rev} for checking',
  'revision.pass': 'passed the check of {rev}',
  'revision.return': 'returned {rev} to the designer',
  'revision.issue': 'issued {rev}',
  'revision.withdraw': 'withdrew {rev}',
  'revision.supersede': '{rev} was superseded',
  'revision.created': 'started {rev}',
  'revision.calculated': 'calculated {rev}',
  'revision.inputs-changed': 'changed the inputs of {rev}',
  'study.created': 'created study {study}',
  'checklist.updated': 'answered a checklist item of {rev}',
  'check-value.added': 'recorded a check value on {rev}',
  'remark.added': 'added a remark to {rev}',
  'remark.resolved': 'closed a remark thread on {rev}',
  'remark.reopened': 'reopened a remark thread on {rev}',
  'checklist.agreed-remaining': 'agreed with every remaining checklist item of {rev}',
  'check-value.changed': 'changed a check value on {rev}',
  'check-value.deleted': 'deleted a check value from {rev}',
  'file.uploaded': 'attached a file to {rev}',
  'record.issued': 'The issued record of {rev} was stored',
  'record.failed': 'The issued record of {rev} could not be rendered',
  'record.retried': 'asked for the record of {rev} to be rendered again',
  'limit-set.published': 'published a limit-set version',
  'cable-type.added': 'added a cable type to the catalogue',
  'membership.added': 'gave someone a role on a project',
  'membership.removed': 'removed someone\'s role on a project',
  'user.invited': 'invited someone',
  'user.joined': 'joined Sheathwise',
  'user.locked': 'A sign-in was locked after repeated failures',
  'user.unlocked': 'unlocked a sign-in',
  'project.document-number-pattern-set': 'set the document-number pattern of a project',
  'record-settings.set': 'changed how records show the engine\'s validation',
  'asset.created': 'added an asset to the register',
  'asset.study-linked': 'recorded that a study covers an asset',
  'asset.edited': 'changed an asset in the register',
  'asset.removed': 'removed an asset from the register',
  'asset.study-link-changed': 'changed how a study covers an asset',
  'asset.study-unlinked': 'recorded that a study no longer covers an asset',
  'obligation-type.added': 'added an obligation type to an owner standard',
  'obligation.recorded': 'recorded an obligation done on an asset',
  'system-data.published': 'published a version of a site\'s system data',
  'exploration.saved': 'saved a design exploration with {rev}',
  'bonding.chosen': 'chose the bonding arrangement of {rev}',
  'exploration.placement-accepted': 'started a new draft from a suggested joint-bay placement',
  'study.needs-review': 'marked {rev} as needing review after new system data',
};

/** Events told without a person ("The issued record … was stored"). */
const IMPERSONAL = new Set(['revision.supersede', 'record.issued', 'record.failed', 'user.locked']);

/** The event as one sentence, with its reason or most telling detail after a colon. */
export function eventSentence(e: EventForWords): string {
  const rev = e.revisionNumber != null ? `revision ${e.revisionNumber}${e.studyCode ? ` of ${e.studyCode}` : ''}` : 'the revision';
  // An unknown type still reads as words ("widget.re-sized" → "recorded widget re sized on …"), never as its key.
  const template = STEP_WORDS[e.type] ?? `recorded ${e.type.replace(/[.-]/g, ' ')}${e.revisionNumber != null ? ' on {rev}' : ''}`;
  const detail = (e.detail ?? {}) as Record<string, unknown>;
  // A study's own creation carries its code in the detail when the caller did not name it.
  const studyCode = e.studyCode || (typeof detail.code === 'string' ? detail.code : '');
  const action = template.replace('{rev}', rev).replace('{study}', studyCode);
  const who = e.actorName ?? 'Sheathwise';
  const head = IMPERSONAL.has(e.type) ? action.charAt(0).toUpperCase() + action.slice(1) : `${who} ${action}`;
  const more = detailWords(e.type, detail);
  return more ? `${head}: ${more}` : `${head}.`;
}

/** The part of an event's detail worth reading, in words; never raw JSON. */
export function detailWords(type: string, d: Record<string, unknown>): string {
  const str = (v: unknown) => (typeof v === 'string' ? v : typeof v === 'number' ? String(v) : '');
  if (typeof d.reason === 'string' && d.reason) return `“${d.reason}”`;
  if (type === 'revision.calculated' && d.verdicts && typeof d.verdicts === 'object') {
    const v = d.verdicts as { pass?: number; fail?: number; noLimit?: number };
    return `engine ${str(d.engineVersion)}, limit-set version ${str(d.limitSetVersion)}; ${v.pass ?? 0} pass, ${v.fail ?? 0} fail, ${v.noLimit ?? 0} without a limit.`;
  }
  if (type === 'revision.inputs-changed') {
    // Events since the sentences were stored carry them; older ones have only path/before/after.
    const told = Array.isArray(d.sentences)
      ? (d.sentences as unknown[]).filter((t): t is string => typeof t === 'string')
      : Array.isArray(d.changes)
        ? (d.changes as Array<{ path?: string; before?: unknown; after?: unknown; text?: string }>).map((c) => c.text ?? pathChange(c.path, c.before, c.after))
        : [];
    if (!told.length) return '';
    return `${told.slice(0, 5).join('; ')}${told.length > 5 ? `; and ${told.length - 5} more` : ''}.`;
  }
  if (type === 'record.issued') return `document ${str(d.documentNumber) || '(no number)'}, SHA-256 ${str(d.sha256).slice(0, 16)}…`;
  if (type === 'record.failed') return str(d.error);
  if (type === 'record.retried') return `the earlier failure was “${str(d.previousError)}”`;
  if (type === 'file.uploaded') return [str(d.fileName), str(d.sha256) && `SHA-256 ${str(d.sha256).slice(0, 16)}…`].filter(Boolean).join(', ');
  if (type === 'project.document-number-pattern-set') return `${str(d.from)} → ${str(d.to)}`;
  if (type === 'record-settings.set' && d.appendValidation && typeof d.appendValidation === 'object') {
    const told = (v: unknown) => (v ? 'the full table appended' : 'the summary with a link');
    const { from, to } = d.appendValidation as { from?: unknown; to?: unknown };
    return `${told(from)} → ${told(to)}`;
  }
  if (type === 'revision.supersede' && d.supersededBy !== undefined) return `by revision ${str(d.supersededBy)}`;
  // The code is already in the sentence ("created study B10"); the title follows.
  if (type === 'study.created') return str(d.title);
  if (type === 'membership.added' || type === 'membership.removed') return [str(d.name) || str(d.email), str(d.role)].filter(Boolean).join(', as ');
  if (type === 'checklist.agreed-remaining' && typeof d.count === 'number') return `${d.count} item${d.count === 1 ? '' : 's'}`;
  if (type === 'check-value.changed' && d.from && d.to) {
    const [from, to] = [d.from, d.to] as Array<{ checkerValue?: unknown }>;
    return `${str(d.itemKey) && itemKeyLabel(str(d.itemKey))}: ${typeof from.checkerValue === 'number' ? formatNumber(from.checkerValue) : '—'} → ${typeof to.checkerValue === 'number' ? formatNumber(to.checkerValue) : '—'}`;
  }
  if (type === 'asset.created') return [str(d.code), str(d.name)].filter(Boolean).join(', ');
  if (type === 'asset.study-linked') return `${str(d.studyCode)} covers ${str(d.assetCode)}`;
  if (type === 'asset.study-unlinked') return `${str(d.studyCode)} no longer covers ${str(d.assetCode)}`;
  if (type === 'asset.removed') return [str(d.assetCode), str(d.name)].filter(Boolean).join(', ');
  if (type === 'asset.edited' || type === 'asset.study-link-changed') return [str(d.assetCode), str(d.studyCode)].filter(Boolean).join(', ');
  if (type === 'obligation-type.added') return `${str(d.name)} (${str(d.ownerStandard)})`;
  if (type === 'obligation.recorded') return `${str(d.obligation)} at ${str(d.assetCode)} on ${str(d.doneOn)} by ${str(d.performedBy)}: ${str(d.result)}`;
  if (type === 'system-data.published') return `${str(d.site)} version ${str(d.version)} (${str(d.source)}, ${str(d.sourceDate)})`;
  if (type === 'study.needs-review' && Array.isArray(d.reasons)) return (d.reasons as unknown[]).map(str).filter(Boolean).join(' ');
  if (type === 'check-value.deleted') return str(d.itemKey) && itemKeyLabel(str(d.itemKey));
  if (type === 'checklist.updated' || type === 'remark.added' || type === 'check-value.added') return [str(d.title) || (str(d.itemKey) && itemKeyLabel(str(d.itemKey))), str(d.answer)].filter(Boolean).join(': ');
  return '';
}

const isObject = (v: unknown) => typeof v === 'object' && v !== null;

/** An old stored change told by its path; an object is summarised, never printed as JSON. */
export function pathChange(path: unknown, before: unknown, after: unknown): string {
  const where = typeof path === 'string' && path ? path : 'the inputs';
  if (isObject(after) && (before === null || before === undefined)) return `${where} added`;
  if (isObject(before) && (after === null || after === undefined)) return `${where} removed`;
  if (isObject(before) || isObject(after)) return `${where} changed`;
  return `${where} ${scalar(before)} → ${scalar(after)}`;
}

const scalar = (v: unknown) => {
  if (v === null || v === undefined) return 'none';
  if (typeof v === 'number') return formatNumber(v);
  const s = String(v);
  return s.length > 40 ? `${s.slice(0, 37)}…` : s;
};
