import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { afterAll, describe, expect, it } from 'vitest';
import { testEnv } from '../helpers/env';
import { demoIds, demoSessions, fixtureInputs, json, send } from '../helpers/workflow-api';
import { figure, timed } from './figures';

// The suite's own cluster (scripts/test.sh exports where it lives); stopped and started here.
function pgCtl(action: 'stop' | 'start') {
  const data = process.env.TEST_PG_DATA;
  const port = process.env.TEST_PG_PORT;
  if (!data || !port) throw new Error('TEST_PG_DATA and TEST_PG_PORT are not set: run the suite with npm test.');
  const command =
    action === 'stop'
      ? `pg_run "$PG_BIN/pg_ctl" -D "${data}" -m fast -w stop`
      : `pg_run "$PG_BIN/pg_ctl" -D "${data}" -l "${data}/server.log" -o "-c listen_addresses=127.0.0.1 -p ${port} -k ${data}" -w start`;
  const run = spawnSync('bash', ['-c', `source scripts/services.sh && ensure_postgres_binaries && ${command}`], { encoding: 'utf8', timeout: 30_000 });
  if (run.status !== 0) throw new Error(`pg_ctl ${action} failed: ${run.stderr || run.stdout}`);
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Polls `probe` until it answers true or `seconds` pass; returns the time it took, ms (Infinity: never). */
async function recoveryTime(probe: () => Promise<boolean>, seconds: number): Promise<number> {
  const t0 = performance.now();
  while (performance.now() - t0 < seconds * 1000) {
    if (await probe().catch(() => false)) return performance.now() - t0;
    await sleep(200);
  }
  return Infinity;
}

let second: ChildProcess | undefined;
afterAll(() => {
  second?.kill();
  // Leave the cluster running for the files after this one, whatever happened above.
  try {
    pgCtl('start');
  } catch {
    /* already running */
  }
});

describe('the database goes away and comes back', () => {
  it('requests during an outage answer 503 with Retry-After, never hang, and service resumes by itself', async () => {
    const sessions = await demoSessions();
    const { projectId } = await demoIds(sessions.designer);
    const studiesPath = `/api/projects/${projectId}/studies`;
    await json(await sessions.designer.fetch(studiesPath), 200);

    pgCtl('stop');
    const during = await Promise.all(Array.from({ length: 12 }, () => timed(() => sessions.designer.fetch(studiesPath))));
    const health = await timed(() => fetch(`${testEnv().appUrl}/api/health`));
    const healthBody = await health.response.json();
    figure('slowest request while the database was down', Math.max(...during.map((d) => d.ms)).toFixed(0), 'ms');

    for (const d of during) {
      expect(d.status).toBe(503);
      expect(d.response.headers.get('retry-after')).toMatch(/^\d+$/);
      expect(d.ms).toBeLessThan(10_000);
    }
    expect(health.status).toBe(503);
    expect(healthBody.database.ok).toBe(false);

    pgCtl('start');
    const recovered = await recoveryTime(async () => (await sessions.designer.fetch(studiesPath)).status === 200, 30);
    figure('time to serve again after the database returned', recovered.toFixed(0), 'ms');
    expect(recovered).toBeLessThan(30_000);
    expect((await fetch(`${testEnv().appUrl}/api/health`)).status).toBe(200);
  });

  it('a server started while the database is down recovers without a restart', async () => {
    const sessions = await demoSessions();
    const { projectId } = await demoIds(sessions.designer);
    pgCtl('stop');
    const port = Number(new URL(testEnv().appUrl).port) + 7;
    second = spawn(process.execPath, ['scripts/serve.mjs'], { env: { ...process.env, HOST: '127.0.0.1', PORT: String(port) }, stdio: 'ignore' });
    const base = `http://127.0.0.1:${port}`;
    const other = sessions.designer.at(base);
    expect(await recoveryTime(async () => (await fetch(`${base}/api/health`)).status > 0, 30)).toBeLessThan(30_000);

    const down = await other.fetch(`/api/projects/${projectId}/studies`);
    expect(down.status).toBe(503);
    expect((await fetch(`${base}/api/health`)).status).toBe(503);

    pgCtl('start');
    const recovered = await recoveryTime(async () => (await other.fetch(`/api/projects/${projectId}/studies`)).status === 200, 30);
    figure('second server: time to serve after the database came up', recovered.toFixed(0), 'ms');
    expect(recovered).toBeLessThan(30_000);
    // Writes work too, which needs the job queue that failed to start at first.
    const { limitSetId } = await demoIds(other);
    const created = await send(other, 'POST', `/api/projects/${projectId}/studies`, {
      code: `R${Date.now() % 100000}`,
      title: 'Created on the server that started without its database',
      kind: fixtureInputs('marrow-lane-fence-exposure').kind,
      limitSetId,
      inputs: fixtureInputs('marrow-lane-fence-exposure'),
    });
    expect(created.status).toBe(201);
    expect((await fetch(`${base}/api/health`)).status).toBe(200);
  });
});
