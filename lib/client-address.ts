/** The client's address as the app's server hands it on, and how limits group addresses. Pure. */

/** Set by scripts/serve.ts on every request, replacing any value the client sent. */
export const CLIENT_ADDRESS_HEADER = "x-chalkline-client-address";

/** The eight 16-bit groups of an IPv6 address ("2001:db8::1" → ["2001", "db8", "0", …, "1"]); null if it is not one. */
function ipv6Groups(address: string): string[] | null {
  let text = address.toLowerCase();
  // A trailing dotted quad ("::ffff:192.0.2.1") is two groups.
  const quad = /(\d{1,3})\.(\d{1,3})\.(\d{1,3})\.(\d{1,3})$/.exec(text);
  if (quad) {
    const [a, b, c, d] = quad.slice(1).map(Number) as [number, number, number, number];
    if ([a, b, c, d].some((n) => n > 255)) return null;
    text = `${text.slice(0, quad.index)}${((a << 8) | b).toString(16)}:${((c << 8) | d).toString(16)}`;
  }
  const halves = text.split("::");
  if (halves.length > 2) return null;
  const head = halves[0] ? halves[0].split(":") : [];
  const tail = halves.length === 2 && halves[1] ? halves[1].split(":") : [];
  const missing = 8 - head.length - tail.length;
  if (halves.length === 1 ? missing !== 0 : missing < 1) return null;
  const groups = [...head, ...Array<string>(halves.length === 2 ? missing : 0).fill("0"), ...tail];
  return groups.every((g) => /^[0-9a-f]{1,4}$/.test(g)) ? groups.map((g) => g.replace(/^0+(?=.)/, "")) : null;
}

/**
 * What a per-address limit counts: an IPv4 address as it is, an IPv6 address by its /64 (one home or
 * office network is given a whole /64, so counting single addresses there would be no limit at all).
 */
export function limitSubject(address: string | null): string {
  if (!address) return "unknown";
  if (!address.includes(":")) return address;
  const groups = ipv6Groups(address);
  return groups ? `${groups.slice(0, 4).join(":")}::/64` : "unknown";
}
