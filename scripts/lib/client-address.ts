/**
 * Who is on the other end of a request. The socket's peer is the client unless it is one of the
 * proxies named in TRUSTED_PROXIES; only then are its forwarded headers believed, and the client
 * is the rightmost hop in X-Forwarded-For that is not itself a trusted proxy.
 */
import type { IncomingMessage } from "node:http";
import { BlockList, isIP } from "node:net";
import { CLIENT_ADDRESS_HEADER } from "../../lib/client-address";

/** The request header the app reads the client's address from; the server sets it on every request. */
export { CLIENT_ADDRESS_HEADER };

/** Headers a client could use to claim another address or host; dropped unless a trusted proxy sent them. */
const FORWARDED_HEADERS = ["x-forwarded-for", "x-forwarded-host", "x-forwarded-proto", "x-forwarded-port", "forwarded", "x-real-ip"];

export type TrustedProxies = { list: BlockList; entries: string[] };

/** "::ffff:192.0.2.1" (an IPv4 peer on a dual-stack socket) → "192.0.2.1"; anything that is not an address → null. */
export function normalizeAddress(value: string | undefined | null): string | null {
  if (!value) return null;
  let text = value.trim();
  // "[2001:db8::1]:443" and "192.0.2.1:8080": a hop written with its port.
  const bracketed = /^\[([^\]]+)\](?::\d+)?$/.exec(text);
  if (bracketed) text = bracketed[1]!;
  else if (/^\d{1,3}(?:\.\d{1,3}){3}:\d+$/.test(text)) text = text.slice(0, text.lastIndexOf(":"));
  const mapped = /^::ffff:(\d{1,3}(?:\.\d{1,3}){3})$/i.exec(text);
  if (mapped) text = mapped[1]!;
  const family = isIP(text);
  if (family === 4) return text;
  if (family === 6) return text.toLowerCase();
  return null;
}

/**
 * Parses TRUSTED_PROXIES: comma-separated addresses and CIDR ranges ("10.0.0.0/8, 2001:db8::/32,
 * 127.0.0.1"). Empty or unset means no proxy is trusted. A bad entry is an error, not silently skipped.
 */
export function parseTrustedProxies(text: string | undefined): TrustedProxies {
  const list = new BlockList();
  const entries: string[] = [];
  for (const raw of (text ?? "").split(",")) {
    const entry = raw.trim();
    if (!entry) continue;
    const [base, bits, ...rest] = entry.split("/");
    const address = normalizeAddress(base);
    const family = address ? isIP(address) : 0;
    if (!address || rest.length > 0) throw new Error(`TRUSTED_PROXIES: "${entry}" is not an address or CIDR range`);
    const type = family === 4 ? "ipv4" : "ipv6";
    if (bits === undefined) list.addAddress(address, type);
    else {
      const prefix = Number(bits);
      if (!/^\d{1,3}$/.test(bits) || prefix > (family === 4 ? 32 : 128)) throw new Error(`TRUSTED_PROXIES: "${entry}" has a bad prefix length`);
      list.addSubnet(address, prefix, type);
    }
    entries.push(entry);
  }
  return { list, entries };
}

export function isTrusted(address: string, trusted: TrustedProxies): boolean {
  if (trusted.entries.length === 0) return false;
  return trusted.list.check(address, isIP(address) === 4 ? "ipv4" : "ipv6");
}

/**
 * The client's address: the socket peer, or, when the peer is a trusted proxy, the rightmost hop
 * of X-Forwarded-For that is not a trusted proxy. Hops left of that are whatever the client wrote
 * and are never read. A hop that is not an address stops the walk at the proxy that passed it on.
 */
export function resolveClientAddress({ peer, forwardedFor, trusted }: { peer: string | null; forwardedFor: string | undefined; trusted: TrustedProxies }): string | null {
  let current = normalizeAddress(peer);
  if (!current) return null;
  const hops = (forwardedFor ?? "").split(",").map((h) => h.trim()).filter(Boolean);
  while (isTrusted(current, trusted) && hops.length > 0) {
    const next = normalizeAddress(hops.pop());
    if (!next) break;
    current = next;
  }
  return current;
}

/**
 * Sets the client address header on an incoming request (replacing any the client sent) and drops
 * the forwarded headers unless the peer is a trusted proxy, so neither Next.js nor next-auth ever
 * sees a forwarded host or address a client made up. Next.js then fills X-Forwarded-For and
 * X-Forwarded-Host from the socket and the Host header.
 */
export function stampClientAddress(request: IncomingMessage, trusted: TrustedProxies): string | null {
  const peer = normalizeAddress(request.socket.remoteAddress);
  const forwardedFor = request.headers["x-forwarded-for"];
  const address = resolveClientAddress({ peer, forwardedFor: Array.isArray(forwardedFor) ? forwardedFor.join(",") : forwardedFor, trusted });
  if (!peer || !isTrusted(peer, trusted)) for (const name of FORWARDED_HEADERS) delete request.headers[name];
  delete request.headers[CLIENT_ADDRESS_HEADER];
  if (address) request.headers[CLIENT_ADDRESS_HEADER] = address;
  // Next.js builds its request from `headers`; keep the raw list in step so no copy keeps the old values.
  const dropped = new Set([CLIENT_ADDRESS_HEADER, ...(!peer || !isTrusted(peer, trusted) ? FORWARDED_HEADERS : [])]);
  const raw: string[] = [];
  for (let i = 0; i + 1 < request.rawHeaders.length; i += 2) {
    if (!dropped.has(request.rawHeaders[i]!.toLowerCase())) raw.push(request.rawHeaders[i]!, request.rawHeaders[i + 1]!);
  }
  if (address) raw.push(CLIENT_ADDRESS_HEADER, address);
  request.rawHeaders.splice(0, request.rawHeaders.length, ...raw);
  return address;
}
