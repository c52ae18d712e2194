import type { IncomingMessage } from "node:http";
import { describe, expect, it } from "vitest";
import { limitSubject } from "@/lib/client-address";
import { CLIENT_ADDRESS_HEADER, normalizeAddress, parseTrustedProxies, resolveClientAddress, stampClientAddress } from "@/scripts/lib/client-address";

// Addresses from the documentation ranges (RFC 5737, RFC 3849) and loopback.
const none = parseTrustedProxies(undefined);
const lb = parseTrustedProxies("10.0.0.0/8, 192.0.2.10, 2001:db8:ffff::/48");

describe("client address", () => {
  it.each([
    ["::ffff:192.0.2.1", "192.0.2.1"],
    ["192.0.2.1:8080", "192.0.2.1"],
    ["[2001:DB8::1]:443", "2001:db8::1"],
    ["2001:db8::1", "2001:db8::1"],
    ["unknown", null],
    ["", null],
    ["192.0.2.256", null],
  ])("normalizes %j to %j", (input, expected) => expect(normalizeAddress(input)).toBe(expected));

  it("with no trusted proxy is the socket's peer, whatever X-Forwarded-For says", () => {
    expect(resolveClientAddress({ peer: "203.0.113.5", forwardedFor: "198.51.100.1", trusted: none })).toBe("203.0.113.5");
    expect(resolveClientAddress({ peer: "127.0.0.1", forwardedFor: "198.51.100.1, 10.0.0.1", trusted: none })).toBe("127.0.0.1");
  });

  it("behind trusted proxies is the rightmost hop that is not one of them", () => {
    expect(resolveClientAddress({ peer: "10.1.2.3", forwardedFor: "198.51.100.1, 203.0.113.9", trusted: lb })).toBe("203.0.113.9");
    expect(resolveClientAddress({ peer: "10.1.2.3", forwardedFor: "198.51.100.1, 203.0.113.9, 192.0.2.10", trusted: lb })).toBe("203.0.113.9");
    expect(resolveClientAddress({ peer: "::ffff:10.1.2.3", forwardedFor: "2001:db8:ffff:1::2, 2001:db8:1::7", trusted: lb })).toBe("2001:db8:1::7");
    // A peer that is not trusted is the client even when it sends the header.
    expect(resolveClientAddress({ peer: "203.0.113.50", forwardedFor: "10.0.0.1", trusted: lb })).toBe("203.0.113.50");
    // A hop that is not an address stops at the proxy that passed it on.
    expect(resolveClientAddress({ peer: "10.1.2.3", forwardedFor: "198.51.100.1, garbage", trusted: lb })).toBe("10.1.2.3");
    // Only proxies all the way: the leftmost.
    expect(resolveClientAddress({ peer: "10.1.2.3", forwardedFor: "10.9.9.9", trusted: lb })).toBe("10.9.9.9");
  });

  it("refuses a TRUSTED_PROXIES entry that is not an address or range", () => {
    expect(() => parseTrustedProxies("10.0.0.0/33")).toThrow(/prefix/);
    expect(() => parseTrustedProxies("proxy.internal")).toThrow(/not an address/);
    expect(parseTrustedProxies(" , ").entries).toEqual([]);
  });

  function incoming(peer: string, headers: Record<string, string>): IncomingMessage {
    return { socket: { remoteAddress: peer }, headers: { ...headers }, rawHeaders: Object.entries(headers).flat() } as unknown as IncomingMessage;
  }

  it("stamps the address and drops forwarded headers a client wrote", () => {
    const request = incoming("::ffff:127.0.0.1", { host: "app.test", "x-forwarded-for": "198.51.100.1", "x-forwarded-host": "elsewhere.test", [CLIENT_ADDRESS_HEADER]: "192.0.2.99" });
    expect(stampClientAddress(request, none)).toBe("127.0.0.1");
    expect(request.headers).toEqual({ host: "app.test", [CLIENT_ADDRESS_HEADER]: "127.0.0.1" });
    expect(request.rawHeaders).toEqual(["host", "app.test", CLIENT_ADDRESS_HEADER, "127.0.0.1"]);
  });

  it("keeps a trusted proxy's forwarded headers", () => {
    const request = incoming("10.0.0.2", { host: "app.test", "x-forwarded-for": "198.51.100.1", "x-forwarded-host": "proofs.example.test" });
    expect(stampClientAddress(request, lb)).toBe("198.51.100.1");
    expect(request.headers["x-forwarded-host"]).toBe("proofs.example.test");
  });

  it.each([
    ["192.0.2.1", "192.0.2.1"],
    ["2001:db8:1:2:3:4:5:6", "2001:db8:1:2::/64"],
    ["2001:db8::1", "2001:db8:0:0::/64"],
    ["2001:0db8:0001:0002::ffff", "2001:db8:1:2::/64"],
    ["::1", "0:0:0:0::/64"],
    [null, "unknown"],
  ])("counts %j for limits as %j", (input, expected) => expect(limitSubject(input)).toBe(expected));
});
