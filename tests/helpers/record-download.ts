import { expect } from 'vitest';
import type { HttpSession } from './http-session';

/** Downloads a revision's record, waiting while the issued record is still being rendered (202). */
export async function downloadRecord(s: HttpSession, revisionId: string, timeoutMs = 30_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const res = await s.fetch(`/api/revisions/${revisionId}/record`);
    if (res.status === 200) return { bytes: new Uint8Array(await res.arrayBuffer()), headers: res.headers };
    expect(res.status).toBe(202);
    if (Date.now() > until) throw new Error('the issued record was not rendered in time');
    await new Promise((r) => setTimeout(r, 300));
  }
}
