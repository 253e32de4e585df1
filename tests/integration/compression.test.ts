import { request } from 'node:http';
import { describe, expect, it } from 'vitest';
import { testEnv } from '../helpers/env';
import { demoSessions } from '../helpers/workflow-api';

/** Raw GET (fetch would decode the body and hide what was sent): the encoding and size on the wire. */
function rawGet(path: string, headers: Record<string, string> = {}): Promise<{ status: number; encoding?: string; type?: string; cache?: string; bytes: number; body: string }> {
  return new Promise((resolve, reject) => {
    const req = request(new URL(path, testEnv().appUrl), { headers: { 'accept-encoding': 'br, gzip', ...headers } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        const raw = Buffer.concat(chunks);
        resolve({ status: res.statusCode ?? 0, encoding: res.headers['content-encoding'], type: res.headers['content-type'], cache: res.headers['cache-control'], bytes: raw.length, body: res.headers['content-encoding'] ? '' : raw.toString('utf8') });
      });
    });
    req.on('error', reject);
    req.end();
  });
}

describe('responses are compressed', () => {
  it('HTML, JSON, JavaScript and CSS go out compressed to a client that accepts it', async () => {
    const plain = await rawGet('/signin', { 'accept-encoding': 'identity' });
    expect(plain.status).toBe(200);
    const script = /<script[^>]+src="(\/_astro\/[^"]+\.js)"/.exec(plain.body)?.[1] ?? /import\("(\/_astro\/[^"]+\.js)"\)|"(\/_astro\/[^"]+\.js)"/.exec(plain.body)?.slice(1).find(Boolean);
    const style = /<link[^>]+href="(\/_astro\/[^"]+\.css)"/.exec(plain.body)?.[1];
    expect(script, 'a script on the sign-in page').toBeTruthy();
    expect(style, 'a stylesheet on the sign-in page').toBeTruthy();

    const sessions = await demoSessions();
    const json = await rawGet('/api/audit?pageSize=100', { cookie: sessions.auditor.cookieHeader() });
    for (const [what, res] of [['HTML', await rawGet('/signin')], ['JSON', json], ['JS', await rawGet(script!)], ['CSS', await rawGet(style!)]] as const) {
      expect(res.status, what).toBe(200);
      expect(res.encoding, `${what} (${res.type})`).toMatch(/^(br|gzip)$/);
    }
    const compressed = await rawGet('/signin');
    console.log(`[figure] sign-in page: ${plain.bytes} bytes plain, ${compressed.bytes} bytes ${compressed.encoding}`);
    expect(compressed.bytes).toBeLessThan(plain.bytes);
  });

  it('serves built files with their type, hashed assets as never changing, and never a file outside the build', async () => {
    const page = await rawGet('/signin', { 'accept-encoding': 'identity' });
    const script = /"(\/_astro\/[^"]+\.js)"/.exec(page.body)?.[1];
    const asset = await rawGet(script!, { 'accept-encoding': 'identity' });
    expect(asset).toMatchObject({ status: 200, type: expect.stringMatching(/javascript/), cache: 'public, max-age=31536000, immutable' });
    expect((await rawGet('/favicon.svg')).type).toMatch(/svg/);
    expect((await rawGet('/_astro/no-such-file.js')).status).toBe(404);
    // Out of the build folder by dots, encoded dots and a source path: nothing is served from disk.
    for (const path of ['/_astro/../../package.json', '/_astro/%2e%2e/%2e%2e/package.json', '/src/middleware.ts']) {
      const res = await rawGet(path, { 'accept-encoding': 'identity' });
      expect(res.body, path).not.toContain('"dependencies"');
      expect(res.body, path).not.toContain('defineMiddleware');
    }
  });

  it('an address with a broken escape sequence is refused as JSON', async () => {
    const res = await rawGet('/api/revisions/%E0%A4%A', { 'accept-encoding': 'identity' });
    expect(res.status).toBe(400);
    expect(JSON.parse(res.body).error).toBe('InvalidInput');
  });
});
