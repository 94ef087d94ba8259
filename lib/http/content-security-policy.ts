/**
 * The Content-Security-Policy of every page, built per request by `proxy.ts` around a fresh nonce.
 * Next.js reads the nonce back from the request's copy of this header and puts it on every script
 * it writes into the page (pages are rendered per request for that: `connection()` in the root
 * layout). Scripts run only with the nonce; 'strict-dynamic' lets those scripts load Next's chunks.
 */
export interface PolicyOptions {
  nonce: string;
  /** Development only: React's debugging needs eval. Never in a production build. */
  dev?: boolean;
  /** Origins the pages may send requests to besides their own (the upload store's presigned PUTs). */
  connectOrigins?: string[];
}

export function contentSecurityPolicy({ nonce, dev = false, connectOrigins = [] }: PolicyOptions): string {
  const directives: [string, ...string[]][] = [
    ["default-src", "'self'"],
    ["script-src", "'self'", `'nonce-${nonce}'`, "'strict-dynamic'", ...(dev ? ["'unsafe-eval'"] : [])],
    // Server-rendered style attributes (React's style prop) need inline styles; scripts never do.
    ["style-src", "'self'", "'unsafe-inline'"],
    // Gauge photos are shown from blob: URLs before they are uploaded.
    ["img-src", "'self'", "data:", "blob:"],
    ["font-src", "'self'"],
    ["connect-src", "'self'", ...connectOrigins],
    // Named apart from script-src, whose 'strict-dynamic' would otherwise refuse the offline worker.
    ["worker-src", "'self'"],
    ["manifest-src", "'self'"],
    ["frame-ancestors", "'none'"],
    ["base-uri", "'self'"],
    ["object-src", "'none'"],
    ["form-action", "'self'"],
  ];
  return directives.map((d) => d.join(" ")).join("; ");
}

/** A nonce of 128 random bits, base64 (what CSP's nonce-source expects). */
export function newNonce(): string {
  return Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
}

/** The nonce of a policy written by contentSecurityPolicy, or null. */
export function nonceOf(policy: string | null | undefined): string | null {
  return /'nonce-([A-Za-z0-9+/=_-]+)'/.exec(policy ?? "")?.[1] ?? null;
}
