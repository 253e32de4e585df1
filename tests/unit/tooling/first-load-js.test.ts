import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { firstLoadScripts, scriptsNamedIn, staticImportsOf, totalBytes } from '../../helpers/first-load-js';

// The page-weight test and the benchmarks rely on this measure: a form of import it misses
// would make every page look lighter than it is. The first two lines are copied from this
// project's dist/client/_astro; the others are further forms Rollup prints (from memory).
describe('static imports in a built chunk', () => {
  it.each([
    ['import{j as e}from"./jsx-runtime.D_zvdyIk.js";', ['/_astro/jsx-runtime.D_zvdyIk.js']],
    ['import"./zod-jitless.Cdwk_XlO.js";import{r as f}from"./index.BMeNvoEf.js"', ['/_astro/zod-jitless.Cdwk_XlO.js', '/_astro/index.BMeNvoEf.js']],
    ['import*as t from"./a.X1.js";', ['/_astro/a.X1.js']],
    ['export{c as d}from"./b.Y2.js";', ['/_astro/b.Y2.js']],
    ["import { $x as y } from './c-d.Z3.js';", ['/_astro/c-d.Z3.js']],
  ])('%s', (code, expected) => {
    expect(staticImportsOf(code)).toEqual(expected);
  });

  it('leaves out code fetched on demand: import() and Vite preload lists', () => {
    const code = 'const t=m.lazy(()=>x(()=>import("./ResultsTab.A1.js"),__vite__mapDeps([0,1])));const d=["_astro/RouteProfileChart.B2.js"];';
    expect(staticImportsOf(code)).toEqual([]);
  });
});

describe('first-load scripts of a page', () => {
  const files: Record<string, string> = {
    '/_astro/island.js': 'import{a}from"./shared.js";import"./side.js";const l=()=>import("./lazy.js");',
    '/_astro/renderer.js': 'import{a}from"./shared.js";',
    '/_astro/shared.js': 'export const a=1;'.repeat(50),
    '/_astro/side.js': 'console.log(1)',
    '/_astro/lazy.js': 'x'.repeat(100_000),
  };
  const read = async (file: string) => {
    if (!(file in files)) throw new Error(`missing ${file}`);
    return files[file];
  };

  it('finds the scripts the HTML names, once each', () => {
    const html = '<astro-island component-url="/_astro/island.js" renderer-url="/_astro/renderer.js"></astro-island><script>import("/_astro/island.js")</script>';
    expect(scriptsNamedIn(html)).toEqual(['/_astro/island.js', '/_astro/renderer.js']);
  });

  it('follows static imports, counts a shared file once, and skips what loads on demand', async () => {
    const scripts = await firstLoadScripts(['/_astro/island.js', '/_astro/renderer.js'], read);
    expect(scripts.map((s) => s.file).sort()).toEqual(['/_astro/island.js', '/_astro/renderer.js', '/_astro/shared.js', '/_astro/side.js']);
    const expected = ['/_astro/island.js', '/_astro/renderer.js', '/_astro/shared.js', '/_astro/side.js'].reduce((sum, f) => sum + gzipSync(files[f]).length, 0);
    expect(totalBytes(scripts)).toBe(expected);
  });
});
