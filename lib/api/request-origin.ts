// Cross-site request checks for requests that change data with a session cookie. A browser sends the cookie
// with a form or fetch from any page of the same site (SameSite=Lax stops only other sites, and only for some
// requests), so such a request must show that it comes from one of Splitfield's own pages: Sec-Fetch-Site
// "same-origin" or an Origin equal to the server's. Requests with a bearer token carry no cookie to abuse;
// clients that send neither header are not browsers (every current browser sends Origin on such requests).
import { ApiError } from './errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

export function changesData(method: string): boolean {
  return !SAFE_METHODS.has(method.toUpperCase());
}

/** The origins pages of this server are served from: the configured public address and the requested host. */
function ownOrigins(request: Request): Set<string> {
  const origins = new Set<string>([new URL(request.url).origin]);
  const host = request.headers.get('host');
  if (host) origins.add(`${new URL(request.url).protocol}//${host}`);
  const configured = process.env.NEXTAUTH_URL;
  if (configured) {
    try {
      origins.add(new URL(configured).origin);
    } catch {
      // An invalid NEXTAUTH_URL is next-auth's to report.
    }
  }
  return origins;
}

/** Why the request is not from this server's own pages, or null when it is (or is not from a browser at all). */
export function crossSiteProblem(request: Request): string | null {
  const site = request.headers.get('sec-fetch-site');
  if (site !== null) {
    return site === 'same-origin' || site === 'none' ? null : `the request came from another site (Sec-Fetch-Site: ${site})`;
  }
  const origin = request.headers.get('origin');
  if (origin === null) return null;
  return ownOrigins(request).has(origin) ? null : `the request came from another origin (${origin})`;
}

/** 403 `cross_site` for a data-changing request sent from another origin. */
export function requireSameOrigin(request: Request): void {
  if (!changesData(request.method)) return;
  const problem = crossSiteProblem(request);
  if (problem) {
    throw new ApiError(403, 'cross_site', `Refused: ${problem}. Use Splitfield's own pages, or an API token from scripts.`);
  }
}

/** 415 unless the request says its body is JSON. */
export function requireJsonContentType(request: Request): void {
  const type = (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
  if (type === 'application/json' || /^application\/[a-z0-9.+-]+\+json$/.test(type)) return;
  throw new ApiError(
    415,
    'unsupported_media_type',
    `Send the body as JSON with "Content-Type: application/json" (got ${type ? `"${type}"` : 'no content type'}).`,
    [{ path: '(content-type)', message: 'must be application/json' }],
  );
}
