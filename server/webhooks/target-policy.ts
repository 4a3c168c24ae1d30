/**
 * Where webhooks may point. By default only https:// to public addresses: a webhook is a request the
 * server makes on an admin's behalf, so loopback, private, link-local (cloud metadata at 169.254.169.254)
 * and unique-local addresses are refused (server-side request forgery, OWASP SSRF Prevention Cheat Sheet).
 * WEBHOOK_ALLOW_PRIVATE_TARGETS=true allows http:// and those addresses (tests, a studio-internal receiver).
 *
 * The URL's host is checked when the webhook is saved (literal addresses and `localhost`) and again
 * before each attempt after resolving the name (dns.lookup), so a public name that resolves to a private
 * address is refused too.
 */
import { lookup } from 'node:dns/promises';
import { isIP } from 'node:net';

/** IPv4 ranges of RFC 6890 special-purpose space a webhook must not reach by default. */
const PRIVATE_V4: [number, number][] = [
  [0x00000000, 8], // 0.0.0.0/8 "this network"
  [0x0a000000, 8], // 10/8 private (RFC 1918)
  [0x64400000, 10], // 100.64/10 shared address space (RFC 6598)
  [0x7f000000, 8], // 127/8 loopback
  [0xa9fe0000, 16], // 169.254/16 link-local
  [0xac100000, 12], // 172.16/12 private (RFC 1918)
  [0xc0a80000, 16], // 192.168/16 private (RFC 1918)
  [0xe0000000, 4], // 224/4 multicast
  [0xf0000000, 4], // 240/4 reserved, broadcast
];

function v4ToInt(ip: string): number {
  return ip.split('.').reduce((n, part) => n * 256 + Number(part), 0);
}

export function isPrivateAddress(ip: string): boolean {
  const kind = isIP(ip);
  if (kind === 4) {
    const n = v4ToInt(ip);
    return PRIVATE_V4.some(([base, bits]) => Math.floor(n / 2 ** (32 - bits)) === Math.floor(base / 2 ** (32 - bits)));
  }
  if (kind === 6) {
    const a = ip.toLowerCase();
    if (a === '::' || a === '::1') return true;
    const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/.exec(a);
    if (mapped) return isPrivateAddress(mapped[1]!);
    // fc00::/7 unique local, fe80::/10 link-local, ff00::/8 multicast
    return /^f[cd]/.test(a) || /^fe[89ab]/.test(a) || a.startsWith('ff');
  }
  return false;
}

function hostOf(url: URL): string {
  return url.hostname.replace(/^\[|\]$/g, '').toLowerCase();
}

/** The message for the `url` field when the saved URL breaks the policy, or null when it may be saved. */
export function targetProblem(rawUrl: string, allowPrivate: boolean): string | null {
  let url: URL;
  try {
    url = new URL(rawUrl);
  } catch {
    return 'URL must be an absolute http:// or https:// address.';
  }
  if (allowPrivate) return null;
  if (url.protocol !== 'https:') return 'URL must use https:// (this server allows http:// only when WEBHOOK_ALLOW_PRIVATE_TARGETS is set).';
  const host = hostOf(url);
  if (host === 'localhost' || host.endsWith('.localhost') || isPrivateAddress(host)) {
    return 'URL must point to a public address; loopback and private addresses are refused on this server.';
  }
  return null;
}

/** Before an attempt: resolve the host and refuse private addresses unless allowed. Returns the reason or null. */
export async function resolvedTargetProblem(rawUrl: string, allowPrivate: boolean): Promise<string | null> {
  const saved = targetProblem(rawUrl, allowPrivate);
  if (saved || allowPrivate) return saved;
  const host = hostOf(new URL(rawUrl));
  if (isIP(host)) return null;
  try {
    const addresses = await lookup(host, { all: true });
    return addresses.some((a) => isPrivateAddress(a.address)) ? `${host} resolves to a private address; refused.` : null;
  } catch (err) {
    return `Could not resolve ${host}: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}.`;
  }
}
