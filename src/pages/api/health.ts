import type { APIRoute } from 'astro';
import { serverConfig } from '../../lib/config.server';
import { database } from '../../lib/server/services.server';
import { checkHealth } from '../../lib/server/health';

export const GET: APIRoute = async () => {
  const cfg = serverConfig();
  const report = await checkHealth(database(), { host: cfg.SMTP_HOST, port: cfg.SMTP_PORT });
  return Response.json(report, { status: report.ok ? 200 : 503 });
};
