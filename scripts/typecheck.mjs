// Type-checks the project with tsc. auth-astro ships TypeScript sources that do not pass
// strict mode on their own; errors inside node_modules are reported but do not fail the run.
import { spawnSync } from 'node:child_process';

// Astro's virtual modules (astro:middleware …) get their types from .astro/, which a fresh
// clone lacks until `astro sync` writes it.
const sync = spawnSync('node_modules/.bin/astro', ['sync'], { encoding: 'utf8' });
if (sync.status !== 0) {
  console.error(sync.stdout + sync.stderr);
  process.exit(1);
}
const run = spawnSync('node_modules/.bin/tsc', ['--noEmit', '-p', '.'], { encoding: 'utf8' });
const lines = (run.stdout + run.stderr).split('\n').filter(Boolean);
const ours = lines.filter((l) => /^[^\s]/.test(l) && !l.startsWith('node_modules/'));
if (ours.length) {
  console.error(lines.filter((l) => !l.startsWith('node_modules/')).join('\n'));
  process.exit(1);
}
console.log(`typecheck: no errors in project files${lines.length ? ` (${lines.length} lines from node_modules ignored)` : ''}`);
