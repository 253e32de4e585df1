import { gzipSync } from 'node:zlib';

/** One script the browser must fetch before a page is interactive, with its gzipped size in bytes. */
export interface LoadedScript {
  file: string;
  gzipBytes: number;
}

/** Every /_astro/*.js a page's HTML names: island components, renderers, page scripts. */
export function scriptsNamedIn(html: string): string[] {
  return [...new Set([...html.matchAll(/\/_astro\/[\w.-]+\.js/g)].map((m) => m[0]))];
}

// Static imports only, as Rollup prints them minified: `import{a as b}from"./x.js"`,
// `import"./x.js"`, `export{c}from"./y.js"`. A dynamic `import("./z.js")` is not matched: the
// browser fetches it later, when the code asks for it, so it is not first-load.
const STATIC_IMPORT = /(?:^|[;\s}])(?:import|export)\s*(?:[\w*{}\s,$]+from\s*)?["']\.\/([\w.-]+\.js)["']/g;

/** The files a chunk imports statically, as /_astro/ paths. */
export function staticImportsOf(code: string): string[] {
  return [...code.matchAll(STATIC_IMPORT)].map((m) => `/_astro/${m[1]}`);
}

/**
 * First-load JavaScript of a page: the scripts its HTML names and everything they import
 * statically, each counted once, gzipped at the default level (what a gzip-serving server sends
 * give or take headers). `read` returns a script's text given its /_astro/ path.
 */
export async function firstLoadScripts(entries: string[], read: (file: string) => Promise<string>): Promise<LoadedScript[]> {
  const seen = new Set<string>();
  const loaded: LoadedScript[] = [];
  const queue = [...entries];
  while (queue.length) {
    const file = queue.pop()!;
    if (seen.has(file)) continue;
    seen.add(file);
    const code = await read(file);
    loaded.push({ file, gzipBytes: gzipSync(code).length });
    queue.push(...staticImportsOf(code));
  }
  return loaded.sort((a, b) => b.gzipBytes - a.gzipBytes);
}

export const totalBytes = (scripts: LoadedScript[]) => scripts.reduce((sum, s) => sum + s.gzipBytes, 0);
