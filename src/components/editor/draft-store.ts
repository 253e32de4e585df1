// Unsaved edits kept in this browser per revision, so a reload, a closed tab or a refresh caused
// by someone else's save never throws them away. `base` is what the edits started from (the
// stored inputs at `version`), which the conflict view needs for a three-way merge.

export interface Draft {
  version: number;
  savedAt: string;
  base: unknown;
  inputs: unknown;
}

const key = (revisionId: string) => `sheathwise.draft.${revisionId}`;

export function readDraft(revisionId: string): Draft | null {
  try {
    const raw = window.localStorage.getItem(key(revisionId));
    return raw ? (JSON.parse(raw) as Draft) : null;
  } catch {
    return null;
  }
}

/** Keeps the draft; false when the browser refuses (storage full or disabled), so the page can say so. */
export function writeDraft(revisionId: string, draft: Draft): boolean {
  try {
    window.localStorage.setItem(key(revisionId), JSON.stringify(draft));
    return true;
  } catch {
    return false;
  }
}

export function clearDraft(revisionId: string) {
  try {
    window.localStorage.removeItem(key(revisionId));
  } catch {
    // Nothing kept, nothing to clear.
  }
}
