// Reads which API routes and methods exist from the route files themselves.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

const HTTP_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'HEAD', 'OPTIONS'];
const appDir = path.resolve(__dirname, '..', '..', 'app');

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((item) => {
    const full = path.join(dir, item.name);
    if (item.isDirectory()) return routeFiles(full);
    return /^route\.(ts|tsx|js|mjs)$/.test(item.name) ? [full] : [];
  });
}

/** The methods a route file exports, by `export const|function NAME` or `export { x as NAME }`. */
export function exportedMethods(source: string): string[] {
  const found = new Set<string>();
  for (const match of source.matchAll(/export\s+(?:async\s+)?(?:function|const|let)\s+([A-Z]+)\b/g)) found.add(match[1]);
  for (const match of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of match[1].split(',')) found.add(part.trim().split(/\s+as\s+/).pop()!.trim());
  }
  return [...found].filter((name) => HTTP_METHODS.includes(name));
}

/** Every "METHOD /api/route/[param]" under app/api, route groups left out as in URLs. */
export function apiRouteMethods(): string[] {
  return routeFiles(path.join(appDir, 'api')).flatMap((file) => {
    const segments = path.relative(appDir, path.dirname(file)).split(path.sep);
    const route = `/${segments.filter((segment) => !/^\(.*\)$/.test(segment)).join('/')}`;
    return exportedMethods(readFileSync(file, 'utf8')).map((method) => `${method} ${route}`);
  });
}
