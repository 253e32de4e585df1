// npm run bench:js: first-load JavaScript of each island, gzipped, read from the last build's
// dist/ without a server or database (a quick measure while splitting bundles). A page's figure
// is its island, the React renderer and, on signed-in pages, the sign-out button. The exact,
// served figure per page is checked by tests/integration/page-weight.test.ts.
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { firstLoadScripts, totalBytes } from '../tests/helpers/first-load-js';

const dist = path.resolve('dist');
const manifestFile = readdirSync(path.join(dist, 'server')).find((f) => /^manifest_.*\.mjs$/.test(f));
if (!manifestFile) throw new Error('No dist/server/manifest_*.mjs: run `node_modules/.bin/astro build` first.');
const manifest = readFileSync(path.join(dist, 'server', manifestFile), 'utf8');
const entryModules = JSON.parse(/"entryModules":(\{[^}]*\})/.exec(manifest)![1]) as Record<string, string>;

// Hydrated islands are listed without an extension; chunks fetched on demand (React.lazy) with one.
const islands = Object.entries(entryModules).filter(([source]) => source.includes('/src/components/') && !/\.tsx?$/.test(source));
const onDemand = Object.entries(entryModules).filter(([source]) => source.includes('/src/components/') && /\.tsx?$/.test(source));
const renderer = `/${entryModules['@astrojs/react/client.js']}`;
const signOut = `/${islands.find(([source]) => source.endsWith('/SignOutButton'))![1]}`;
const read = async (file: string) => readFileSync(path.join(dist, 'client', file), 'utf8');
const kb = (bytes: number) => `${(bytes / 1024).toFixed(1)} kB`;

const rows = [];
for (const [source, file] of islands) {
  const name = path.basename(source);
  const signedOut = name === 'SignInForm' || name === 'AcceptInvitationForm';
  const scripts = await firstLoadScripts([renderer, `/${file}`, ...(signedOut ? [] : [signOut])], read);
  rows.push({ name, total: totalBytes(scripts), scripts });
}
rows.sort((a, b) => b.total - a.total);
for (const row of rows) {
  console.log(`${row.name.padEnd(24)} ${kb(row.total).padStart(9)}   ${row.scripts.slice(0, 6).map((s) => `${path.basename(s.file)} ${kb(s.gzipBytes)}`).join(', ')}`);
}

// What each on-demand chunk adds, on top of the revision page, when its tab or part first opens.
const workspace = rows.find((r) => r.name === 'RevisionWorkspace');
const already = new Set(workspace?.scripts.map((s) => s.file));
console.log('\non demand (added to the revision page when first used):');
for (const [source, file] of onDemand) {
  const added = (await firstLoadScripts([`/${file}`], read)).filter((s) => !already.has(s.file));
  console.log(`${path.basename(source).padEnd(24)} ${kb(totalBytes(added)).padStart(9)}`);
}
