// The production server: Astro's built handler (Node adapter, middleware mode) behind gzip/brotli
// compression and a few headers that static files need as much as pages do, and the static files
// themselves. Run after `astro build`: `HOST=127.0.0.1 PORT=4321 node scripts/serve.mjs`.
import { timingSafeEqual } from 'node:crypto';
import http from 'node:http';
import { fileURLToPath } from 'node:url';
import compression from 'compression';
import send from 'send';

const { handler: render } = await import(new URL('../dist/server/entry.mjs', import.meta.url).href);
const clientDir = fileURLToPath(new URL('../dist/client/', import.meta.url));

// Every built file has an extension (/_astro/*.js|css|woff2, favicon.svg); pages and endpoints
// have none. Only the former are looked for on disk: a file-system probe before every API
// request was a sixth of the server's CPU under load.
const FILE = /\.[a-z0-9]+$/i;

function staticOrRendered(req, res) {
  const path = (req.url ?? '/').split('?')[0];
  if (!FILE.test(path)) return render(req, res);
  const file = send(req, path, { root: clientDir, dotfiles: 'deny', index: false });
  file.on('error', () => render(req, res));
  file.on('headers', (out) => {
    // Built assets carry a content hash in their names: they never change under one name.
    if (path.startsWith('/_astro/')) out.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
  });
  file.pipe(res);
}

const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 4321);
// HTML, JSON, JS, CSS and SVG are compressed (the package's default filter, by content type);
// fonts (woff2) and DOCX are compressed already.
const compress = compression({ threshold: 1024 });

// Astro takes the client's address from X-Forwarded-For whenever it is present, and sign-in
// throttles per address: the header is believed only from our own proxy (scripts/cluster.mjs),
// which connects over loopback and shows the secret it gave this process. Anyone else's is dropped.
const proxySecret = process.env.SHEATHWISE_PROXY_SECRET ? Buffer.from(process.env.SHEATHWISE_PROXY_SECRET) : null;
const LOOPBACK = /^(127\.|::1$|::ffff:127\.)/;

function fromOurProxy(req) {
  const shown = req.headers['x-sheathwise-proxy'];
  if (!proxySecret || typeof shown !== 'string' || !LOOPBACK.test(req.socket.remoteAddress ?? '')) return false;
  const given = Buffer.from(shown);
  return given.length === proxySecret.length && timingSafeEqual(given, proxySecret);
}

const server = http.createServer((req, res) => {
  // Pages get their full set (CSP included) from the app's middleware; static files get these.
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Referrer-Policy', 'no-referrer');
  if (!fromOurProxy(req)) delete req.headers['x-forwarded-for'];
  delete req.headers['x-sheathwise-proxy'];
  if (req.url?.startsWith('/api/') && !decodable(req.url)) {
    res.writeHead(400, { 'Content-Type': 'application/json' });
    res.end(JSON.stringify({ error: 'InvalidInput', title: 'Input needs correcting', message: 'The address holds an escape sequence that is not valid (for example %E0%A4%A).' }));
    return;
  }
  compress(req, res, () => staticOrRendered(req, res));
});

function decodable(url) {
  try {
    decodeURI(url);
    return true;
  } catch {
    return false;
  }
}

server.listen(port, host, () => console.log(`Sheathwise listening on http://${host}:${port}`));
for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    server.close(() => process.exit(0));
    // Open keep-alive connections would hold close() up; do not wait for them for long.
    setTimeout(() => process.exit(0), 3000).unref();
    server.closeIdleConnections();
  });
}
