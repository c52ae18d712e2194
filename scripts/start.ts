/**
 * `npm start` (production build) and `npm run dev` (dev server): PostgreSQL, migrations, demo data,
 * local fakes, then the app. Prints the URL and the demo sign-ins.
 */
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from "../db/demo";
import { buildApp, buildIsFresh, startNext, startWorker, stopChild, waitForHealth } from "./lib/next";
import { bringUpStack } from "./lib/stack";

const dev = process.argv.includes("--dev");
const port = Number(process.env.PORT ?? 3000);
const log = (line: string) => console.log(`[chalkline] ${line}`);

const stack = await bringUpStack({ mode: "dev", port }).catch((error: unknown) => {
  console.error(`\n[chalkline] could not start: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});

let shuttingDown = false;
// Assigned once the app starts; shutdown() may run before that.
// eslint-disable-next-line prefer-const
let app: ReturnType<typeof startNext> | undefined;
// eslint-disable-next-line prefer-const
let worker: ReturnType<typeof startWorker> | undefined;
async function shutdown(code: number) {
  if (shuttingDown) return;
  shuttingDown = true;
  log("stopping…");
  if (app) await stopChild(app);
  if (worker) await stopChild(worker);
  await stack.shutdown();
  process.exit(code);
}
process.on("SIGINT", () => void shutdown(0));
process.on("SIGTERM", () => void shutdown(0));

if (!dev && !buildIsFresh()) {
  try {
    await buildApp(stack.env, log);
  } catch (error) {
    console.error(`[chalkline] the build failed: ${error instanceof Error ? error.message : String(error)}`);
    await shutdown(1);
  }
}

app = startNext({ dev, port, env: stack.env });
worker = startWorker(stack.env);
app.on("exit", (code) => {
  if (!shuttingDown) {
    log(`the app stopped (code ${code ?? "?"})`);
    void shutdown(code ?? 1);
  }
});

const url = `http://localhost:${port}`;
try {
  await waitForHealth(url, dev ? 180_000 : 90_000, app!);
} catch (error) {
  console.error(`[chalkline] ${error instanceof Error ? error.message : String(error)}`);
  await shutdown(1);
}

const width = Math.max(...DEMO_ACCOUNTS.map((a) => a.email.length));
console.log(`
  Chalkline is running at ${url}

  Demo sign-ins (password: ${DEMO_PASSWORD})
${DEMO_ACCOUNTS.map((a) => `    ${a.email.padEnd(width)}  ${a.role}`).join("\n")}
${stack.env.MAIL_FAKE_API ? `\n  E-mail sent by the app lands in ${url}/dev/mailbox?key=${stack.env.MAIL_FAKE_KEY}\n  (the key is this install's own, in .data/fakes-key; without it the mailbox is not there)\n` : ""}
  Press Ctrl+C to stop.
`);
