import { env } from "@/lib/env";

type HeaderSource = Headers | Record<string, string | string[] | undefined> | undefined;

function header(source: HeaderSource, name: string): string | undefined {
  if (!source) return undefined;
  if (source instanceof Headers) return source.get(name) ?? undefined;
  const value = source[name];
  return Array.isArray(value) ? value.join(",") : value;
}

/**
 * The caller's address for throttling and the audit log, or null when it cannot be known.
 * X-Forwarded-For is believed only when TRUSTED_PROXY_HOPS says how many proxies of ours stand in
 * front of the app: the address is then the one the outermost trusted proxy saw, counted from the
 * right, where a client cannot write. Without a trusted proxy the header is the client's own word
 * (Next fills it from the socket only when the client sent none), so it is not used: a forged
 * header can neither dodge a limit nor lock others out, and nobody shares an "unknown" bucket.
 */
export function clientAddress(source: HeaderSource, hops = env.TRUSTED_PROXY_HOPS): string | null {
  if (hops <= 0) return null;
  const chain = (header(source, "x-forwarded-for") ?? "")
    .split(",")
    .map((part) => part.trim())
    .filter(Boolean);
  const address = chain[chain.length - hops];
  return address && /^[0-9a-fA-F.:[\]]{2,64}$/.test(address) ? address : null;
}
