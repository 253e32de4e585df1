import pg from 'pg';
import { GENESIS, eventHash } from './audit-log';
import { inScope, type AuditScope } from './audit-scope';

// One stretch of the audit chain checked on its own connection, in a compute worker thread.
// Each event is checked against the stored hash of the event before it, so stretches are
// independent: the chain is split among the threads and the reports are joined in order.

const BATCH = 5000;

export const BREAK_REASONS = {
  link: 'it does not point at the event before it (an event was removed or reordered)',
  content: 'its content no longer matches its hash (the event was changed)',
};

export interface RangeReport {
  /** Events inside the reader's scope that were checked. */
  checked: number;
  /** Every event checked, in any scope. */
  total: number;
  firstBroken?: { id: number; reason: string };
  brokenOutsideScope: boolean;
  /** The last event checked and its stored hash (null: the stretch held no event). */
  last: { id: number; hash: string } | null;
}

interface Row {
  id: string;
  at: Date;
  actor_id: string | null;
  type: string;
  project_id: string | null;
  study_id: string | null;
  revision_id: string | null;
  detail: Record<string, unknown>;
  prev_hash: string;
  hash: string;
}

/** Checks the events with afterId < id ≤ upToId, reading them in batches. */
export async function verifyAuditRange(databaseUrl: string, scope: AuditScope, afterId: number, upToId: number): Promise<RangeReport> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const before = await client.query<{ hash: string }>('select hash from audit_events where id <= $1 order by id desc limit 1', [afterId]);
    let prev = before.rows[0]?.hash ?? GENESIS;
    const report: RangeReport = { checked: 0, total: 0, brokenOutsideScope: false, last: null };
    let cursor = afterId;
    for (;;) {
      const { rows } = await client.query<Row>(
        'select id, at, actor_id, type, project_id, study_id, revision_id, detail, prev_hash, hash from audit_events where id > $1 and id <= $2 order by id limit $3',
        [cursor, upToId, BATCH],
      );
      for (const row of rows) {
        const id = Number(row.id);
        const sealed = { at: row.at, actorId: row.actor_id, type: row.type, projectId: row.project_id, studyId: row.study_id, revisionId: row.revision_id, detail: row.detail, prevHash: row.prev_hash };
        const reason = row.prev_hash !== prev ? BREAK_REASONS.link : row.hash !== eventHash(sealed) ? BREAK_REASONS.content : null;
        const visible = inScope(scope, sealed);
        report.total++;
        if (visible) report.checked++;
        if (reason && visible) report.firstBroken ??= { id, reason };
        if (reason && !visible) report.brokenOutsideScope = true;
        prev = row.hash;
        report.last = { id, hash: row.hash };
      }
      if (rows.length < BATCH) return report;
      cursor = Number(rows[rows.length - 1].id);
    }
  } finally {
    await client.end();
  }
}
