import { bigint, index, integer, pgTable, varchar } from "drizzle-orm/pg-core";

/**
 * Rate limit counters shared by every app process: one row per rule and subject (the key is
 * "rule:hashed subject"), the points used in the current window and when the window ends (ms since
 * the epoch). The columns and their order are the ones rate-limiter-flexible's PostgreSQL store
 * writes (`INSERT … VALUES (key, points, expire)`); it is told the table exists.
 */
export const rateLimits = pgTable(
  "rate_limits",
  {
    key: varchar("key", { length: 255 }).primaryKey(),
    points: integer("points").notNull().default(0),
    expire: bigint("expire", { mode: "number" }),
  },
  (t) => [index("rate_limits_expire_idx").on(t.expire)],
);
