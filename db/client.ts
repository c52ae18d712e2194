import "server-only";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import * as schema from "./schema";

export type Database = NodePgDatabase<typeof schema>;

const globalForDb = globalThis as unknown as { chalklinePool?: Pool; chalklineDb?: Database };

function createPool(): Pool {
  const url = process.env.DATABASE_URL;
  if (!url) {
    throw new Error("DATABASE_URL is not set. Start the app with `npm start`, which sets it up for you.");
  }
  const pool = new Pool({
    connectionString: url,
    max: Number(process.env.DATABASE_POOL_MAX ?? 10),
    connectionTimeoutMillis: 3_000,
    idleTimeoutMillis: 30_000,
  });
  // An idle client losing its connection (database restart) must not crash the server.
  pool.on("error", (error) => {
    console.error("[db] idle connection error:", error.message);
  });
  // The pool listens for errors only while a client is idle. A client that is checked out (say
  // between two statements of a transaction) when the database goes away would otherwise emit an
  // unhandled "error" and take the process down. Its query fails instead, and the pool drops it
  // on release because it is no longer queryable; the next query opens a fresh connection.
  pool.on("connect", (client) => {
    client.on("error", (error) => {
      console.error("[db] connection lost:", error.message);
    });
  });
  return pool;
}

export function getPool(): Pool {
  globalForDb.chalklinePool ??= createPool();
  return globalForDb.chalklinePool;
}

export function getDb(): Database {
  globalForDb.chalklineDb ??= drizzle(getPool(), { schema });
  return globalForDb.chalklineDb;
}

/** Lazily connected database; importing this module never opens a connection. */
export const db = new Proxy({} as Database, {
  get(_target, property) {
    const real = getDb();
    const value = Reflect.get(real, property, real);
    return typeof value === "function" && property !== "constructor" ? value.bind(real) : value;
  },
});
