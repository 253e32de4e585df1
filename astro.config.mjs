// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';
import auth from 'auth-astro';
import { validationGuard } from './scripts/validation-guard.ts';

// The port is baked into the Host allow-list at build time, so the build and the server
// must agree on it: scripts/ exports SHEATHWISE_PORT before building.
const port = Number(process.env.SHEATHWISE_PORT ?? 4321);

export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'standalone' }),
  integrations: [react(), auth(), validationGuard()],
  server: { host: '127.0.0.1', port },
  security: {
    allowedDomains: [
      { protocol: 'http', hostname: '127.0.0.1', port: String(port) },
      { protocol: 'http', hostname: 'localhost', port: String(port) },
    ],
  },
  vite: { plugins: [tailwindcss()] },
});
