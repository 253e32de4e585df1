/**
 * Issue 15: `npm start` works wherever a newcomer clones the repository. A fresh clone in a
 * private (mode 700) folder must get a running database from its own scripts/services.sh:
 * as root, whose cluster runs as the postgres user and so must live outside the clone, and as
 * a user without privileges, whose cluster runs as that user inside the clone.
 * Needs no shared service of npm test; it starts and removes its own clusters.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { cpSync, existsSync, mkdtempSync, readFileSync, realpathSync, rmSync, statSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';

const run = promisify(execFile);
const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const isRoot = process.getuid?.() === 0;
const PROBE_USER = 'sheathwise-probe';
const ELSEWHERE_BASE = '/var/lib/sheathwise';
// The files under test: the clone gets the working tree's copies, so that the test checks the
// code beside it even before it is committed (on CI they equal the committed ones).
const FILES_UNDER_TEST = ['scripts/services.sh', 'tests/helpers/pg-in-clone.sh'];
// Both cases together stay under a minute, even on a busy 2-core machine.
const CASE_SECONDS = 22;

const leftovers: string[] = [];
afterEach(() => {
  for (const dir of leftovers.splice(0)) {
    stopLeftoverCluster(dir);
    rmSync(dir, { recursive: true, force: true });
  }
});

/** A cluster left running by a failed case: SIGQUIT is PostgreSQL's immediate shutdown. */
function stopLeftoverCluster(dir: string) {
  for (const pidFile of [path.join(dir, 'pg', 'postmaster.pid'), path.join(dir, 'p', '.data', 'pg', 'postmaster.pid')]) {
    if (!existsSync(pidFile)) continue;
    const pid = Number(readFileSync(pidFile, 'utf8').split('\n')[0]);
    try {
      process.kill(pid, 'SIGQUIT');
    } catch {
      // already gone
    }
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
  });
}

async function ensureProbeUser() {
  const exists = () => run('id', ['-u', PROBE_USER]).then(() => true, () => false);
  if (await exists()) return;
  // A system account without home or login shell; kept afterwards, since another run may use it.
  await run('useradd', ['--system', '--no-create-home', '--shell', '/usr/sbin/nologin', PROBE_USER]).catch(
    async (error) => {
      if (!(await exists())) throw error; // a parallel run may have made it first
    },
  );
}

/** Clones this repository into a new mode-700 folder (owned by `owner` when given). */
async function cloneIntoPrivateFolder(owner?: string) {
  const parent = mkdtempSync(path.join(tmpdir(), 'sheathwise-clone-'));
  leftovers.push(parent);
  const clone = path.join(parent, 'p');
  const top = await run('git', ['-C', repoRoot, 'rev-parse', '--show-toplevel']).then(
    (r) => r.stdout.trim(),
    () => null,
  );
  if (top) {
    await run('git', ['clone', '-q', top, clone], { timeout: 20_000 });
  } else {
    // Not a git checkout (an unpacked archive): copy what a clone would hold.
    const skip = new Set(['node_modules', '.data', 'dist', '.astro', 'test-artifacts']);
    cpSync(repoRoot, clone, { recursive: true, filter: (src) => !skip.has(path.basename(src)) });
  }
  for (const file of FILES_UNDER_TEST) cpSync(path.join(repoRoot, file), path.join(clone, file));
  if (owner) await run('chown', ['-R', `${owner}:`, parent]);
  expect(statSync(parent).mode & 0o777).toBe(0o700);
  return { parent, clone };
}

/** Runs tests/helpers/pg-in-clone.sh from the clone, as `user` when given, from inside the clone. */
async function startDatabaseInClone(clone: string, user?: string) {
  const port = await freePort();
  const script = ['timeout', String(CASE_SECONDS), 'bash', path.join(clone, 'tests/helpers/pg-in-clone.sh'), clone, String(port)];
  const [command, args] = user
    ? ['runuser', ['-u', user, '--', 'env', `HOME=${path.dirname(clone)}`, ...script]]
    : [script[0], script.slice(1)];
  const { stdout } = await run(command, args, { cwd: clone, timeout: (CASE_SECONDS + 3) * 1000 }).catch((error) => {
    throw new Error(`database did not start in the clone:\n${error.stdout ?? ''}${error.stderr ?? ''}`);
  });
  const result = Object.fromEntries(
    [...stdout.matchAll(/^result (\w+)=(.*)$/gm)].map((m) => [m[1], m[2]] as [string, string]),
  );
  return { log: stdout, result };
}

describe('a fresh clone in a private folder gets its database', () => {
  it.skipIf(!isRoot)(
    'as root: the cluster runs as postgres in a folder outside the clone, named after the checkout',
    async () => {
      const { parent, clone } = await cloneIntoPrivateFolder();
      const modeBefore = statSync(parent).mode;
      const checkoutHash = createHash('sha256').update(realpathSync(clone)).digest('hex').slice(0, 12);
      const elsewhere = `${ELSEWHERE_BASE}/p-${checkoutHash}`;
      leftovers.push(elsewhere);
      const { log, result } = await startDatabaseInClone(clone);
      const pgDir = result.pg_dir ?? '';
      if (pgDir.startsWith(`${ELSEWHERE_BASE}/`)) leftovers.push(path.dirname(pgDir));

      expect(pgDir).toBe(`${elsewhere}/pg`);
      expect(log).toContain(`is kept in ${pgDir}`); // the start-up log says where
      expect(readFileSync(path.join(clone, '.data/pg-location'), 'utf8').trim()).toBe(elsewhere);
      expect(result.select).toBe('1');
      expect(result.server_user).toBe('postgres');
      expect(result.stopped).toBe('yes');
      expect(statSync(parent).mode).toBe(modeBefore); // the user's folder is left private
      expect(existsSync(path.join(clone, '.data/pg'))).toBe(false); // only the cluster moved out
    },
    (CASE_SECONDS + 6) * 1000,
  );

  it(
    'as a user without privileges: the cluster runs as that user inside the clone',
    async () => {
      const user = isRoot ? PROBE_USER : undefined;
      if (user) await ensureProbeUser();
      const { parent, clone } = await cloneIntoPrivateFolder(user);
      const modeBefore = statSync(parent).mode;
      const { result } = await startDatabaseInClone(clone, user);

      expect(result.pg_dir).toBe(path.join(clone, '.data/pg'));
      expect(result.select).toBe('1');
      expect(result.server_user).toBe(user ?? (await run('id', ['-un'])).stdout.trim());
      expect(result.stopped).toBe('yes');
      expect(statSync(parent).mode).toBe(modeBefore);
    },
    (CASE_SECONDS + 6) * 1000,
  );
});
