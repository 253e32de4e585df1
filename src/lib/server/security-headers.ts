import { createHash } from 'node:crypto';
import { defineMiddleware } from 'astro:middleware';

/**
 * Headers every response carries. CSP is set per response: HTML pages get the hashes of their own
 * inline scripts (Astro inlines the island loader), so no inline script runs that the server did
 * not send. Styles keep 'unsafe-inline': React renders style attributes (the charts) and Astro
 * inlines small stylesheets; CSS cannot run script, and no untrusted markup is rendered.
 */
const FIXED_HEADERS: Record<string, string> = {
  'x-content-type-options': 'nosniff',
  'referrer-policy': 'no-referrer',
  // For browsers that ignore CSP frame-ancestors.
  'x-frame-options': 'DENY',
  'cross-origin-opener-policy': 'same-origin',
  'permissions-policy': 'camera=(), microphone=(), geolocation=(), payment=()',
};

export function contentSecurityPolicy(scriptHashes: string[], opts: { dev?: boolean } = {}): string {
  const scripts = ["'self'", ...scriptHashes.map((h) => `'${h}'`)];
  return [
    "default-src 'self'",
    `script-src ${scripts.join(' ')}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    // Vite's dev server reloads over a WebSocket; the built server needs none.
    `connect-src 'self'${opts.dev ? ' ws: wss:' : ''}`,
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
}

const INLINE_SCRIPT = /<script\b([^>]*)>([\s\S]*?)<\/script\s*>/gi;

/** The CSP hash sources ('sha256-…') of the executable inline scripts in an HTML page. */
export function inlineScriptHashes(html: string): string[] {
  const hashes = new Set<string>();
  for (const [, attrs, body] of html.matchAll(INLINE_SCRIPT)) {
    if (/\bsrc\s*=/i.test(attrs)) continue;
    const type = /\btype\s*=\s*["']?([^"'\s>]+)/i.exec(attrs)?.[1]?.toLowerCase();
    // Data blocks are never executed, so they need no hash.
    if (type && type !== 'module' && !type.includes('javascript')) continue;
    hashes.add(`sha256-${createHash('sha256').update(body, 'utf8').digest('base64')}`);
  }
  return [...hashes];
}

/** The response with the security headers set; HTML is read once to hash its inline scripts. */
export async function withSecurityHeaders(response: Response, opts: { dev?: boolean } = {}): Promise<Response> {
  const isHtml = (response.headers.get('content-type') ?? '').includes('text/html');
  let body: BodyInit | null = response.body;
  let hashes: string[] = [];
  if (isHtml && response.body) {
    const html = await response.text();
    hashes = inlineScriptHashes(html);
    body = html;
  }
  const headers = new Headers(response.headers);
  if (isHtml) headers.delete('content-length');
  for (const [name, value] of Object.entries(FIXED_HEADERS)) headers.set(name, value);
  headers.set('content-security-policy', contentSecurityPolicy(hashes, opts));
  // A new Response: some responses (redirects, fetched ones) have immutable headers.
  return new Response(body, { status: response.status, statusText: response.statusText, headers });
}

export const securityHeaders = defineMiddleware(async (_context, next) => withSecurityHeaders(await next(), { dev: import.meta.env.DEV }));
