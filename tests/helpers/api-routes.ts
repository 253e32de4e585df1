import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

/** Every endpoint under src/pages/api as "METHOD /api/route/[param]", read from the files. */
export function apiRoutes(dir = 'src/pages/api'): string[] {
  const routes: string[] = [];
  for (const name of readdirSync(dir)) {
    const file = path.join(dir, name);
    if (statSync(file).isDirectory()) routes.push(...apiRoutes(file));
    else if (file.endsWith('.ts')) {
      const route = '/' + path.relative('src/pages', file).replace(/\\/g, '/').replace(/\.ts$/, '').replace(/\/index$/, '');
      for (const [, method] of readFileSync(file, 'utf8').matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)) routes.push(`${method} ${route}`);
    }
  }
  return routes;
}
