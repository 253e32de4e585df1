import { readFileSync } from 'node:fs';
import { request } from 'node:http';
import { describe, expect, it } from 'vitest';
import { demoSessions, json, readyDraft } from '../helpers/workflow-api';
import { figure } from './figures';

const MIB = 1024 * 1024;

/** The server process's resident memory, bytes (scripts/test.sh exports its pid). */
function serverRss(): number {
  const pid = process.env.TEST_SERVER_PID;
  if (!pid) throw new Error('TEST_SERVER_PID is not set: run the suite with npm test.');
  // The pid must be the server itself, not a shell that started it.
  if (!readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes('serve.mjs')) throw new Error(`process ${pid} is not the server`);
  const kb = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1];
  return Number(kb) * 1024;
}

/** A multipart body of `totalMiB` MiB, made one MiB at a time as it is read. */
function streamedMultipart(boundary: string, totalMiB: number): ReadableStream<Uint8Array> {
  const enc = new TextEncoder();
  const chunk = new Uint8Array(MIB).fill(0x41);
  let sent = -1;
  return new ReadableStream({
    pull(controller) {
      if (sent === -1) controller.enqueue(enc.encode(`--${boundary}\r\nContent-Disposition: form-data; name="kind"\r\n\r\nother\r\n--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="huge.csv"\r\nContent-Type: text/csv\r\n\r\n`));
      else if (sent < totalMiB) controller.enqueue(chunk);
      else {
        controller.enqueue(enc.encode(`\r\n--${boundary}--\r\n`));
        controller.close();
      }
      sent++;
    },
  });
}

describe('an oversize upload is refused as it arrives', () => {
  it('a 200 MiB streamed upload costs the server far less than its size, and the server answers afterwards', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer, 'kestrel-single-point-ecc', 'U');
    const boundary = 'sheathwise-probe-boundary';
    const before = serverRss();
    let peak = before;
    const sampler = setInterval(() => (peak = Math.max(peak, serverRss())), 20);
    let status: number | string;
    try {
      const res = await sessions.designer.fetch(`/api/revisions/${revisionId}/files`, {
        method: 'POST',
        headers: { 'content-type': `multipart/form-data; boundary=${boundary}` },
        body: streamedMultipart(boundary, 200),
        duplex: 'half',
      } as RequestInit);
      status = res.status;
    } catch (err) {
      // The server may close the connection once it has refused the upload.
      status = (err as Error).message;
    } finally {
      clearInterval(sampler);
    }
    const growth = (peak - before) / MIB;
    figure('server memory growth during a 200 MiB upload', growth.toFixed(1), 'MiB');
    figure('answer to the 200 MiB upload', status);
    expect(growth).toBeLessThan(50);
    if (typeof status === 'number') expect(status).toBe(413);
    const list = await json(await sessions.designer.fetch(`/api/revisions/${revisionId}/files`), 200);
    expect(list.files).toHaveLength(0);
  });

  it('a declared length over the limit is refused before the body is read', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer, 'kestrel-single-point-ecc', 'U');
    // Raw HTTP: the headers promise 200 MiB, and no byte of the body is ever sent.
    const url = new URL(`${sessions.designer.base}/api/revisions/${revisionId}/files`);
    const answer = await new Promise<{ status: number; body: string }>((resolve, reject) => {
      const req = request(url, {
        method: 'POST',
        headers: { cookie: sessions.designer.cookieHeader(), origin: url.origin, 'content-type': 'multipart/form-data; boundary=x', 'content-length': String(200 * MIB) },
      });
      req.on('response', (res) => {
        let body = '';
        res.on('data', (c) => (body += c));
        res.on('end', () => {
          resolve({ status: res.statusCode ?? 0, body });
          req.destroy();
        });
      });
      req.on('error', reject);
      req.setTimeout(15_000, () => reject(new Error('no answer within 15 s: the server waited for the body')));
      req.flushHeaders();
    });
    expect(answer.status).toBe(413);
    expect(JSON.parse(answer.body).fields[0]).toEqual({ field: 'file', message: expect.stringContaining('MiB') });
  });
});
