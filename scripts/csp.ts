// The Content-Security-Policy of the built app: one home for the policy the build writes into
// index.html (a <meta> tag), the preview server sends as a header, and the hosting notes document.

/** Directives every copy of the policy shares: scripts, styles, workers and images from the app itself only. */
const BASE: Record<string, string> = {
  'default-src': "'self'",
  // No inline script and no eval: the built app is module files only.
  'script-src': "'self'",
  // Styles from the app's CSS files; components set styles through the DOM (allowed), never inline <style>.
  'style-src': "'self'",
  // data: and blob: for the plot's share picture and its preview.
  'img-src': "'self' data: blob:",
  'font-src': "'self'",
  'worker-src': "'self'",
  'manifest-src': "'self'",
  'object-src': "'none'",
  'base-uri': "'self'",
  'form-action': "'self'",
};

/**
 * Where the app may send requests. The office sync endpoint is typed by the user on the phone, so a
 * policy shipped inside the app cannot name it: the meta tag allows any https: origin plus a receiver
 * on this computer (http://127.0.0.1 and http://localhost, any port) for an office running it locally.
 */
export const CONNECT_SRC_ANY_OFFICE = "'self' https: http://127.0.0.1:* http://localhost:*";

/** The policy as one header or meta value; `connectSrc` narrows where requests may go. */
export function contentSecurityPolicy(options: { connectSrc?: string; frameAncestors?: string } = {}): string {
  const directives = { ...BASE, 'connect-src': options.connectSrc ?? CONNECT_SRC_ANY_OFFICE };
  // frame-ancestors is ignored in a <meta> tag (CSP Level 3 §6.4.2), so only headers carry it.
  const all = options.frameAncestors ? { ...directives, 'frame-ancestors': options.frameAncestors } : directives;
  return Object.entries(all).map(([k, v]) => `${k} ${v}`).join('; ');
}

/** The policy for a host that knows its office endpoint, e.g. officeHeader('https://office.example.org'). */
export function officeHeader(officeOrigin: string): string {
  return contentSecurityPolicy({ connectSrc: `'self' ${officeOrigin}`, frameAncestors: "'none'" });
}
