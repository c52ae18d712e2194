import { describe, expect, it } from "vitest";
import { contentSecurityPolicy, cspSourcesFromEnv, newNonce, pageSecurityHeaders } from "@/lib/security-headers";

function directives(csp: string): Record<string, string[]> {
  return Object.fromEntries(
    csp.split(";").map((part) => {
      const [name, ...values] = part.trim().split(/\s+/);
      return [name!, values];
    }),
  );
}

describe("content security policy", () => {
  const local = cspSourcesFromEnv({ UPLOADTHING_FAKE_URL: "http://127.0.0.1:2620/", STRIPE_FAKE_URL: "http://127.0.0.1:2630", APP_URL: "http://localhost:3100", NODE_ENV: "production" });

  it("allows scripts only with this request's nonce, and no eval outside next dev", () => {
    const d = directives(contentSecurityPolicy("abc123", local));
    expect(d["script-src"]).toEqual(["'self'", "'nonce-abc123'", "'strict-dynamic'"]);
    expect(d["style-src"]).toEqual(["'self'", "'unsafe-inline'"]);
    expect(d["object-src"]).toEqual(["'none'"]);
    expect(d["frame-ancestors"]).toEqual(["'none'"]);
    expect(d["base-uri"]).toEqual(["'self'"]);
    expect(d["upgrade-insecure-requests"]).toBeUndefined();
    const dev = directives(contentSecurityPolicy("abc123", { ...local, dev: true }));
    expect(dev["script-src"]).toContain("'unsafe-eval'");
    expect(dev["connect-src"]).toContain("ws:");
  });

  it("lets the browser reach the local upload and payments fakes under both loopback names", () => {
    const d = directives(contentSecurityPolicy("n", local));
    expect(d["connect-src"]).toEqual(["'self'", "http://127.0.0.1:2620", "http://localhost:2620"]);
    expect(d["img-src"]).toEqual(["'self'", "data:", "blob:", "http://127.0.0.1:2620", "http://localhost:2620"]);
    expect(d["form-action"]).toEqual(["'self'", "http://127.0.0.1:2630", "http://localhost:2630"]);
  });

  it("names the hosted upload and checkout hosts when no fake is set, and upgrades requests over https", () => {
    const hosted = cspSourcesFromEnv({ APP_URL: "https://proofs.example.test", NODE_ENV: "production" });
    const d = directives(contentSecurityPolicy("n", hosted));
    expect(d["connect-src"]).toEqual(["'self'", "https://*.ingest.uploadthing.com", "https://api.uploadthing.com"]);
    expect(d["img-src"]).toEqual(["'self'", "data:", "blob:", "https://*.ufs.sh", "https://utfs.io"]);
    expect(d["form-action"]).toEqual(["'self'", "https://checkout.stripe.com"]);
    expect(d["upgrade-insecure-requests"]).toEqual([]);
    expect(pageSecurityHeaders(hosted)["Strict-Transport-Security"]).toMatch(/^max-age=\d+/);
    expect(pageSecurityHeaders(local)["Strict-Transport-Security"]).toBeUndefined();
  });

  it("makes a new 128-bit nonce every time", () => {
    const a = newNonce();
    const b = newNonce();
    expect(a).not.toBe(b);
    // 16 bytes in base64 is 24 characters with padding.
    expect(a).toMatch(/^[A-Za-z0-9+/]{22}==$/);
    expect(Buffer.from(a, "base64")).toHaveLength(16);
  });
});
