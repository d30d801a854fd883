// The address a request came from, for per-address limits. The server stamps the socket's address on every
// request (instrumentation.ts, CLIENT_ADDRESS_HEADER) over anything a client sent in that header; behind a
// reverse proxy (SPLITFIELD_TRUST_PROXY=1) the first address of X-Forwarded-For, which the proxy sets, is used.

export const CLIENT_ADDRESS_HEADER = 'x-splitfield-client-address';

export function clientAddress(request: Request, trustProxy: boolean): string {
  if (trustProxy) {
    const forwarded = request.headers.get('x-forwarded-for')?.split(',')[0]?.trim();
    if (forwarded) return forwarded;
  }
  return request.headers.get(CLIENT_ADDRESS_HEADER) ?? 'unknown';
}
