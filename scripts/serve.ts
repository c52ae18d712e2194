/**
 * The app's HTTP server: Next.js behind a few lines that decide who the client is. Route handlers
 * and server actions never see the socket, and Next.js keeps an X-Forwarded-For the client wrote,
 * so this server works out the address (the socket's peer, or through a proxy in TRUSTED_PROXIES
 * the rightmost untrusted X-Forwarded-For hop), drops forwarded headers no trusted proxy sent, and
 * hands the address on in one header of its own.
 *
 * `node --import tsx scripts/serve.ts [--dev] [-p port] [-H host]` (what `npm start`, `npm run dev`, `npm test` and
 * `npm run serve` run; not the `tsx` command, which kills a busy child 60 ms after SIGTERM).
 */
import { randomBytes } from "node:crypto";
import { createServer, type ServerResponse } from "node:http";
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

// SIGTERM or SIGINT: stop taking connections, let the requests in flight finish (each answer says
// `Connection: close`, idle keep-alive sockets are closed), then exit; after CHALKLINE_DRAIN_SECONDS
// (30 by default) whatever is still open is cut and the exit code says so.
const drainSeconds = Number(process.env.CHALKLINE_DRAIN_SECONDS ?? 30);
if (!Number.isFinite(drainSeconds) || drainSeconds < 0) {
  console.error(`[serve] CHALKLINE_DRAIN_SECONDS must be a number of seconds (got "${process.env.CHALKLINE_DRAIN_SECONDS}")`);
  process.exit(1);
}
const inFlight = new Set<ServerResponse>();
let draining = false;

const server = createServer((request, response) => {
  inFlight.add(response);
  // Next.js puts up to ten close listeners of its own on a response; this one is ours, beyond those.
  response.setMaxListeners(response.getMaxListeners() + 1);
  response.once("close", () => {
    inFlight.delete(response);
    // Its socket is idle now (or closing): close it rather than wait for the next request on it.
    if (draining) server.closeIdleConnections();
  });
  if (draining) response.setHeader("Connection", "close");
  stampClientAddress(request, trusted);
  void handle(request, response);
});
server.listen(port, hostname, () => {
  console.log(`[serve] listening on http://${hostname}:${port}${trusted.entries.length ? ` (trusted proxies: ${trusted.entries.join(", ")})` : ""}`);
});

function drain(signal: NodeJS.Signals) {
  if (draining) return;
  draining = true;
  for (const response of inFlight) if (!response.headersSent) response.setHeader("Connection", "close");
  let closed = false;
  server.close(() => {
    closed = true;
    console.log("[serve] every request answered; stopping");
    void app.close().finally(() => process.exit(0));
  });
  server.closeIdleConnections();
  // Said once the listener is closed: whoever reads this line finds the port refusing connections.
  console.log(`[serve] ${signal}: no new connections; finishing ${inFlight.size} request(s) in flight (at most ${drainSeconds} s)`);
  setTimeout(() => {
    if (closed) process.exit(0);
    console.error(`[serve] ${inFlight.size} request(s) still open after ${drainSeconds} s; cutting them`);
    server.closeAllConnections();
    process.exit(1);
  }, drainSeconds * 1000).unref();
}
process.on("SIGTERM", drain);
process.on("SIGINT", drain);
