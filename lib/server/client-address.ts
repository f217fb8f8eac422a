/**
 * The client's network address, for rate limits and the audit log.
 *
 * The only address nobody can forge is the TCP peer of the connection. Next.js does not hand the socket
 * to a route handler, so the server is started with scripts/peer-address.cjs preloaded: it copies
 * `socket.remoteAddress` into the request header `x-tauforge-peer` for every request, overwriting any
 * value a client sent, and marks the process (globalThis.__tauforgePeerHeader) so this module knows the
 * header can be believed. Without the preload (a bare `next dev`) the peer is "unknown".
 *
 * `X-Forwarded-For` is read only when the peer is one of the proxies listed in TAUFORGE_TRUSTED_PROXIES
 * (comma-separated addresses or CIDR blocks, e.g. `127.0.0.1, 10.0.0.0/8, ::1`). The list is walked from
 * the right (the hop nearest to us) and the first address that is not a trusted proxy is the client —
 * the common practice of reverse proxies (nginx's real_ip_recursive, RFC 7239 §7.4 on forged entries):
 * entries left of the first untrusted hop were written by the client and are ignored.
 */
import { BlockList, isIP } from 'node:net';

export const PEER_HEADER = 'x-tauforge-peer';

const g = globalThis as unknown as { __tauforgePeerHeader?: boolean; __tauforgeProxies?: { spec: string; list: BlockList } };

/** `::ffff:1.2.3.4` (an IPv4 peer on a dual-stack socket) → `1.2.3.4`; brackets and zone ids dropped. */
export function normalizeAddress(raw: string): string | null {
  let a = raw.trim();
  if (a.startsWith('[')) a = a.slice(1, a.indexOf(']') > 0 ? a.indexOf(']') : undefined);
  a = a.replace(/%.*$/, '');
  const m = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(a);
  if (m) a = m[1];
  // An IPv4 entry with a port ("1.2.3.4:5678") as some proxies write it.
  const withPort = /^(\d+\.\d+\.\d+\.\d+):\d+$/.exec(a);
  if (withPort) a = withPort[1];
  return isIP(a) ? a.toLowerCase() : null;
}

/** Parse TAUFORGE_TRUSTED_PROXIES; throws on an entry that is not an address or a CIDR block. */
export function parseTrustedProxies(spec: string | undefined): BlockList {
  const list = new BlockList();
  for (const raw of (spec ?? '').split(',').map((s) => s.trim()).filter(Boolean)) {
    const [addr, bits] = raw.split('/');
    const a = normalizeAddress(addr);
    if (!a) throw new Error(`TAUFORGE_TRUSTED_PROXIES: "${raw}" is not an IP address or CIDR block`);
    const type = isIP(a) === 6 ? 'ipv6' : 'ipv4';
    if (bits === undefined) list.addAddress(a, type);
    else {
      const n = Number(bits);
      if (!/^\d+$/.test(bits) || n > (type === 'ipv4' ? 32 : 128)) throw new Error(`TAUFORGE_TRUSTED_PROXIES: "${raw}" has a bad prefix length`);
      list.addSubnet(a, n, type);
    }
  }
  return list;
}

function trustedProxies(): BlockList {
  const spec = process.env.TAUFORGE_TRUSTED_PROXIES ?? '';
  if (g.__tauforgeProxies?.spec !== spec) g.__tauforgeProxies = { spec, list: parseTrustedProxies(spec) };
  return g.__tauforgeProxies.list;
}

function isTrusted(list: BlockList, a: string): boolean {
  return list.check(a, isIP(a) === 6 ? 'ipv6' : 'ipv4');
}

/**
 * The client address from the TCP peer and the X-Forwarded-For header, trusting the header only as far
 * as the chain of trusted proxies reaches. Pure: the tests call it with every combination.
 */
export function resolveClientAddress(peer: string | null, forwardedFor: string | null, trusted: BlockList): string {
  const p = peer ? normalizeAddress(peer) : null;
  if (!p) return 'unknown';
  if (!isTrusted(trusted, p) || !forwardedFor) return p;
  const hops = forwardedFor.split(',').map((s) => s.trim()).filter(Boolean);
  let client = p;
  for (let i = hops.length - 1; i >= 0; i--) {
    const a = normalizeAddress(hops[i]);
    if (!a) return client; // garbage from further left cannot be trusted; keep the last good hop
    client = a;
    if (!isTrusted(trusted, a)) return a;
  }
  return client;
}

/** The peer address the server preload put on the request, or null when the preload is absent. */
export function peerOf(headers: { get(name: string): string | null }): string | null {
  if (!g.__tauforgePeerHeader) return null;
  return headers.get(PEER_HEADER);
}

/** The client address of a request (Fetch API headers). */
export function clientAddressOf(headers: { get(name: string): string | null }): string {
  return resolveClientAddress(peerOf(headers), headers.get('x-forwarded-for'), trustedProxies());
}
