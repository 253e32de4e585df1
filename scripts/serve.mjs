// The production server: Astro's built handler (Node adapter, standalone) behind gzip/brotli
// compression and a few headers that static files need as much as pages do. Run after
// `astro build`: `HOST=127.0.0.1 PORT=4321 node scripts/serve.mjs`.
import http from 'node:http';
import compression from 'compression';

process.env.ASTRO_NODE_AUTOSTART = 'disabled';
const { handler } = await import(new URL('../dist/server/entry.mjs', import.meta.url).href);

const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 4321);
// HTML, JSON, JS, CSS and SVG are compressed (the package's default filter, by content type);
// fonts (woff2) and DOCX are compressed already.
const compress = compression({ threshold: 1024 });

const server = http.createServer((req, res) => {
  // Pages get their full set (CSP included) from the app's middleware; static files get these.
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Referrer-Policy', 'no-referrer');
  if (req.url?.startsWith('/api/') && !decodable(req.url)) {
    res.writeHead(400, { 'Content-Type': 'application/json' });
    res.end(JSON.stringify({ error: 'InvalidInput', title: 'Input needs correcting', message: 'The address holds an escape sequence that is not valid (for example %E0%A4%A).' }));
    return;
  }
  compress(req, res, () => handler(req, res));
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
