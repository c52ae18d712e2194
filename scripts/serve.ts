/**
 * The app's HTTP server: Next.js behind a few lines that decide who the client is. Route handlers
 * and server actions never see the socket, and Next.js keeps an X-Forwarded-For the client wrote,
 * so this server works out the address (the socket's peer, or through a proxy in TRUSTED_PROXIES
 * the rightmost untrusted X-Forwarded-For hop), drops forwarded headers no trusted proxy sent, and
 * hands the address on in one header of its own.
 *
 * `tsx scripts/serve.ts [--dev] [-p port] [-H host]` (what `npm start`, `npm run dev` and `npm test` run).
 */
import { randomBytes } from "node:crypto";
import { createServer } from "node:http";
import { parseTrustedProxies, stampClientAddress } from "./lib/client-address";
import { repoRoot } from "./lib/proc";

const args = process.argv.slice(2);
const option = (flag: string, fallback: string) => {
  const at = args.indexOf(flag);
  return at >= 0 && args[at + 1] ? args[at + 1]! : fallback;
};
const dev = args.includes("--dev");
const port = Number(option("-p", process.env.PORT ?? "3000"));
const hostname = option("-H", process.env.HOST ?? "127.0.0.1");

let trusted;
try {
  trusted = parseTrustedProxies(process.env.TRUSTED_PROXIES);
} catch (error) {
  console.error(`[serve] ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
}
// Tells the app (same process) that every request went through stampClientAddress.
process.env.CHALKLINE_CLIENT_ADDRESS = "stamped";
// Review pages kept per state (lib/kept-pages.ts): the key of the app's own renders, the stand-in
// nonce they carry, and where this process answers. Made fresh per process, never sent out.
Object.assign(process.env, {
  CHALKLINE_RENDER_KEY: randomBytes(24).toString("base64url"),
  CHALKLINE_NONCE_STAND_IN: randomBytes(16).toString("base64"),
  CHALKLINE_SELF_URL: `http://${hostname === "0.0.0.0" ? "127.0.0.1" : hostname === "::" ? "[::1]" : hostname}:${port}`,
});
// As `next start` / `next dev` do, before React and Next.js are loaded.
Object.assign(process.env, { NODE_ENV: process.env.NODE_ENV ?? (dev ? "development" : "production") });
const { default: next } = await import("next");

const app = next({ dev, dir: repoRoot, hostname, port });
const handle = app.getRequestHandler();
await app.prepare();

const server = createServer((request, response) => {
  stampClientAddress(request, trusted);
  void handle(request, response);
});
server.listen(port, hostname, () => {
  console.log(`[serve] listening on http://${hostname}:${port}${trusted.entries.length ? ` (trusted proxies: ${trusted.entries.join(", ")})` : ""}`);
});

let closing = false;
function close() {
  if (closing) return;
  closing = true;
  server.close(() => void app.close().finally(() => process.exit(0)));
  server.closeAllConnections();
  setTimeout(() => process.exit(0), 5_000).unref();
}
process.on("SIGTERM", close);
process.on("SIGINT", close);
