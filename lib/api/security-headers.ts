// The browser security headers of Splitfield's responses. Pages get a Content-Security-Policy with a fresh nonce
// per request (proxy.ts; Next.js puts the nonce on its own scripts): scripts only from this server and those
// nonced, no plugins, no framing by other sites, no remote images (Markdown images are shown as links), fonts
// and data from this server only. Styles allow inline ones: React writes style attributes in server-rendered
// HTML and Observable Plot puts a <style> element into each chart. The other headers, and the API's policy
// (its answers are never documents to render), are set for every response in next.config.mjs.

export function pageContentSecurityPolicy(nonce: string): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
}
