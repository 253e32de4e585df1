// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';
import auth from 'auth-astro';
import { validationGuard } from './scripts/validation-guard.ts';

// The dev server's port; scripts/ export SHEATHWISE_PORT before building.
const port = Number(process.env.SHEATHWISE_PORT ?? 4321);

export default defineConfig({
  output: 'server',
  // Middleware mode: scripts/serve.mjs is the server, and serves the built files itself.
  adapter: node({ mode: 'middleware' }),
  integrations: [react(), auth(), validationGuard()],
  server: { host: '127.0.0.1', port },
  security: {
    // Loopback on any port: the same build serves the app's port, and the processes behind the
    // local proxy (scripts/cluster.mjs) and the two-server test on ports of their own.
    allowedDomains: [
      { protocol: 'http', hostname: '127.0.0.1' },
      { protocol: 'http', hostname: 'localhost' },
    ],
  },
  vite: { plugins: [tailwindcss()] },
});
