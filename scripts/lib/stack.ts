/**
 * Brings up what the app needs on this machine: PostgreSQL on loopback, migrations, demo data,
 * and the local fakes of hosted services. Used by `npm start`, `npm run dev` and `npm test`.
 */
import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { DEV_DB, ensurePostgres, migrate, stopPostgres, TEST_DB } from "../db";
import { DEV_MAIL, startSmtpFake, TEST_MAIL } from "../fakes/smtp";
import { DEV_UPLOADS, FAKE_APP_ID, fakeApiKey, fakeUploadsEnv, startUploadthingFake, TEST_UPLOADS } from "../fakes/uploadthing";
import { DEV_STRIPE, fakeStripeEnv, fakeStripeKeys, startStripeFake, TEST_STRIPE } from "../fakes/stripe";
import { runSeed } from "../seed";
import { repoRoot } from "./proc";

export type StackMode = "dev" | "test";

export type Stack = {
  env: Record<string, string>;
  databaseUrl: string;
  shutdown: () => Promise<void>;
};

function log(line: string) {
  console.log(`[chalkline] ${line}`);
}

/** A secret of this install: from the environment, or made once into .data/<file> (never committed). */
function installSecret(envVar: string, file: string, bytes: number): string {
  const fromEnv = process.env[envVar];
  if (fromEnv) return fromEnv;
  const dir = path.join(repoRoot, ".data");
  mkdirSync(dir, { recursive: true, mode: 0o755 });
  const target = path.join(dir, file);
  if (existsSync(target)) return readFileSync(target, "utf8").trim();
  const secret = randomBytes(bytes).toString("base64url");
  writeFileSync(target, `${secret}\n`, { mode: 0o600 });
  return secret;
}

/** AUTH_SECRET: taken from the environment, or generated once into .data/. */
export function authSecret(): string {
  return installSecret("AUTH_SECRET", "auth-secret", 32);
}

/**
 * The key of the local fakes' own pages and APIs (the mail catcher, the payments fake's admin
 * endpoints): FAKES_KEY from the environment, or one made once per install into .data/.
 */
export function fakesKey(): string {
  return installSecret("FAKES_KEY", "fakes-key", 24);
}

/**
 * CHALKLINE_PORT_OFFSET moves every test port (database, fakes, app) by the same amount, so a
 * second checkout on this machine can run its tests beside the first. The fakes sit 100 ports
 * apart, so use a multiple of 1000 (1000, 2000…) or an offset under 40. Dev ports never move.
 */
export function testPortOffset(): number {
  const raw = process.env.CHALKLINE_PORT_OFFSET;
  if (!raw) return 0;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0 || n > 9000) throw new Error(`CHALKLINE_PORT_OFFSET must be a whole number from 0 to 9000 (got "${raw}")`);
  return n;
}

export async function bringUpStack(opts: { mode: StackMode; port: number }): Promise<Stack> {
  const closers: Array<() => Promise<void>> = [];
  try {
    return await bringUp(opts, closers);
  } catch (error) {
    // Whatever came up before the failure goes down again, so a retry finds its ports free.
    await closeAll(closers);
    throw error;
  }
}

async function closeAll(closers: Array<() => Promise<void>>): Promise<void> {
  for (const close of closers.reverse()) {
    try {
      await close();
    } catch (error) {
      log(`shutdown: ${error instanceof Error ? error.message : String(error)}`);
    }
  }
}

async function bringUp({ mode, port }: { mode: StackMode; port: number }, closers: Array<() => Promise<void>>): Promise<Stack> {
  const offset = mode === "test" ? testPortOffset() : 0;
  const suffix = offset ? `-${offset}` : "";
  const target = mode === "test" ? { ...TEST_DB, port: TEST_DB.port + offset, dataDir: TEST_DB.dataDir + suffix } : DEV_DB;
  const dbLog = (line: string) => log(`db: ${line}`);

  const external = mode === "test" ? process.env.TEST_DATABASE_URL : process.env.DATABASE_URL;
  const pg = await ensurePostgres({
    ...target,
    fast: mode === "test",
    log: dbLog,
    envVar: mode === "test" ? "TEST_DATABASE_URL" : "DATABASE_URL",
  });
  if (pg.startedHere) closers.push(async () => void (await stopPostgres({ dataDir: target.dataDir, log: dbLog })));
  if (external) log("using the database server from the environment; none started");

  if (mode === "test") await resetDatabase(pg.url);
  const migrated = await migrate(pg.url);
  log(`migrations: ${migrated.applied} applied, ${migrated.total} in all`);
  const seeded = await runSeed(pg.url);
  log(seeded.seeded ? "demo data seeded into the empty database" : "database already has data; demo seed skipped");

  const baseUrl = `http://localhost:${port}`;
  const env: Record<string, string> = {
    DATABASE_URL: pg.url,
    NEXTAUTH_URL: process.env.NEXTAUTH_URL ?? baseUrl,
    APP_URL: process.env.APP_URL ?? baseUrl,
    NEXTAUTH_SECRET: authSecret(),
    AUTH_SECRET: authSecret(),
    PORT: String(port),
  };

  if (process.env.SMTP_URL) {
    log("e-mail: sending through SMTP_URL");
  } else {
    const mail = mode === "test" ? { smtpPort: TEST_MAIL.smtpPort + offset, httpPort: TEST_MAIL.httpPort + offset, dir: TEST_MAIL.dir + suffix } : DEV_MAIL;
    const key = fakesKey();
    const fake = await startSmtpFake({ ...mail, key, log: (line) => log(`mail: ${line}`) });
    closers.push(() => fake.close());
    env.MAIL_FAKE_SMTP_PORT = String(mail.smtpPort);
    env.MAIL_FAKE_API = `http://127.0.0.1:${mail.httpPort}`;
    env.MAIL_FAKE_KEY = key;
    log(`e-mail: local catcher on 127.0.0.1:${mail.smtpPort}; read it at ${baseUrl}/dev/mailbox?key=${key}`);
  }

  if (process.env.UPLOADTHING_TOKEN && !process.env.UPLOADTHING_FAKE_URL) {
    log("uploads: using the hosted upload service from UPLOADTHING_TOKEN");
  } else {
    const uploads = mode === "test" ? { port: TEST_UPLOADS.port + offset, dir: TEST_UPLOADS.dir + suffix } : DEV_UPLOADS;
    const apiKey = fakeApiKey();
    const fake = await startUploadthingFake({ ...uploads, apiKey, appId: FAKE_APP_ID, log: (line) => log(`uploads: ${line}`) });
    closers.push(() => fake.close());
    Object.assign(env, fakeUploadsEnv({ url: fake.url, apiKey, appId: FAKE_APP_ID, appUrl: env.APP_URL! }));
    log(`uploads: local fake of the upload service on ${fake.url}; files in ${path.relative(repoRoot, uploads.dir)}`);
  }

  if (process.env.STRIPE_SECRET_KEY && !process.env.STRIPE_FAKE_URL) {
    log("payments: using the hosted payments service from STRIPE_SECRET_KEY");
  } else {
    const target = mode === "test" ? { port: TEST_STRIPE.port + offset, dir: TEST_STRIPE.dir + suffix } : DEV_STRIPE;
    const keys = fakeStripeKeys();
    const fake = await startStripeFake({
      ...target,
      webhookUrl: `http://127.0.0.1:${port}/api/stripe/webhook`,
      webhookSecret: keys.webhookSecret,
      secretKey: keys.secretKey,
      adminKey: fakesKey(),
      log: (line) => log(`payments: ${line}`),
    });
    closers.push(() => fake.close());
    Object.assign(env, fakeStripeEnv({ url: fake.url, ...keys }));
    env.STRIPE_FAKE_ADMIN_KEY = fake.adminKey;
    log(`payments: local fake of the payments API on ${fake.url}; its checkout page says it is a test page`);
  }

  return {
    env,
    databaseUrl: pg.url,
    shutdown: () => closeAll(closers),
  };
}

/** Test runs start from an empty schema, so every run sees the same demo data. */
async function resetDatabase(url: string): Promise<void> {
  const { Client } = await import("pg");
  const client = new Client({ connectionString: url });
  await client.connect();
  try {
    await client.query("drop schema if exists public cascade; drop schema if exists drizzle cascade; create schema public;");
  } finally {
    await client.end();
  }
}
