import { drizzle, type MySql2Database } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import { env } from "@/lib/env";
import * as schema from "./schema";

export type Db = MySql2Database<typeof schema>;

const globalForDb = globalThis as unknown as { halfmaxPool?: mysql.Pool; halfmaxDb?: Db };

/** Shared pool (one per process; survives dev hot reloads). Dates are UTC on both sides. */
export function pool(): mysql.Pool {
  if (!globalForDb.halfmaxPool) {
    globalForDb.halfmaxPool = mysql.createPool({
      uri: env().DATABASE_URL,
      connectionLimit: 20,
      timezone: "Z",
      dateStrings: false,
      supportBigNumbers: true,
      connectTimeout: 5_000,
    });
  }
  return globalForDb.halfmaxPool;
}

export function db(): Db {
  if (!globalForDb.halfmaxDb) {
    // MariaDB has no LATERAL joins: relational queries need the "planetscale" mode.
    globalForDb.halfmaxDb = drizzle(pool(), { schema, mode: "planetscale" });
  }
  return globalForDb.halfmaxDb;
}

/** The type of the `tx` argument inside db().transaction(async (tx) => …). */
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
export type DbOrTx = Db | Tx;

export async function closeDb(): Promise<void> {
  const p = globalForDb.halfmaxPool;
  globalForDb.halfmaxPool = undefined;
  globalForDb.halfmaxDb = undefined;
  if (p) await p.end();
}

export { schema };
