// N server processes behind a small reverse proxy, for running more than one process on one
// machine (the demo; in production put your own load balancer in front of the processes).
// `SHEATHWISE_PROCESSES=N npm start` uses it; by hand, after `npm run build`:
//   PORT=4321 SHEATHWISE_PROCESSES=2 node scripts/cluster.mjs
// The proxy listens on HOST:PORT; the processes on 127.0.0.1, ports PORT+1 … PORT+N
// (SHEATHWISE_FIRST_PROCESS_PORT moves them). Requests go round the processes in turn. Every
// process shares the database, object store and mail catcher: nothing is kept in one
// process's memory, so any process serves any request.
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import http from 'node:http';
import net from 'node:net';
import { fileURLToPath } from 'node:url';

const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 4321);
const count = Number(process.env.SHEATHWISE_PROCESSES ?? 2);
const firstPort = Number(process.env.SHEATHWISE_FIRST_PROCESS_PORT ?? port + 1);
if (!Number.isInteger(count) || count < 1 || count > 32) throw new Error(`SHEATHWISE_PROCESSES must be a whole number from 1 to 32, not "${process.env.SHEATHWISE_PROCESSES}".`);

// The processes believe X-Forwarded-For only from a loopback peer that shows this secret, so
// a client cannot choose the address that sign-in throttling counts against (scripts/serve.mjs).
const proxySecret = randomBytes(32).toString('hex');
const serveScript = fileURLToPath(new URL('./serve.mjs', import.meta.url));
const backends = Array.from({ length: count }, (_, i) => ({ index: i + 1, port: firstPort + i, child: null, stopping: false }));
const agent = new http.Agent({ keepAlive: true, maxSockets: 256 });

function startBackend(b) {
  b.child = spawn(process.execPath, [serveScript], {
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(b.port), SHEATHWISE_PROXY_SECRET: proxySecret, SHEATHWISE_PROCESS_INDEX: String(b.index) },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  b.child.on('exit', (code, signal) => {
    if (b.stopping) return;
    console.error(`[cluster] process ${b.index} (port ${b.port}) ended (${signal ?? code}); starting it again in 1 s`);
    setTimeout(() => startBackend(b), 1000).unref();
  });
}

let next = 0;
// Hop-by-hop headers (RFC 9110 §7.6.1) are not forwarded.
const HOP = new Set(['connection', 'keep-alive', 'proxy-connection', 'transfer-encoding', 'te', 'trailer', 'upgrade']);

const proxy = http.createServer((req, res) => {
  const b = backends[next++ % backends.length];
  const headers = {};
  for (const [name, value] of Object.entries(req.headers)) if (!HOP.has(name) && name !== 'x-sheathwise-proxy') headers[name] = value;
  // The client as this proxy saw it; whatever the client claimed is dropped.
  headers['x-forwarded-for'] = req.socket.remoteAddress ?? 'unknown';
  headers['x-sheathwise-proxy'] = proxySecret;
  const upstream = http.request({ host: '127.0.0.1', port: b.port, method: req.method, path: req.url, headers, agent }, (answer) => {
    const out = { ...answer.headers, 'x-sheathwise-process': String(b.index) };
    for (const name of HOP) delete out[name];
    res.writeHead(answer.statusCode ?? 502, out);
    answer.pipe(res);
  });
  upstream.on('error', (err) => {
    if (res.headersSent) return res.destroy(err);
    res.writeHead(503, { 'Content-Type': 'application/json', 'Retry-After': '2' });
    res.end(JSON.stringify({ error: 'Unavailable', title: 'Service unavailable', message: `Server process ${b.index} is not answering (${err.code ?? err.message}). Try again shortly.` }));
  });
  req.pipe(upstream);
});

const listening = (p) => new Promise((resolve) => {
  const socket = net.connect({ host: '127.0.0.1', port: p });
  socket.once('connect', () => { socket.destroy(); resolve(true); });
  socket.once('error', () => resolve(false));
});

backends.forEach(startBackend);
for (let i = 0; i < 600 && !(await Promise.all(backends.map((b) => listening(b.port)))).every(Boolean); i++) await new Promise((r) => setTimeout(r, 100));
proxy.listen(port, host, () => console.log(`Sheathwise listening on http://${host}:${port} (${count} processes on ports ${firstPort}–${firstPort + count - 1})`));

for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    for (const b of backends) {
      b.stopping = true;
      b.child?.kill('SIGTERM');
    }
    proxy.close(() => process.exit(0));
    proxy.closeIdleConnections();
    setTimeout(() => process.exit(0), 4000).unref();
  });
}
