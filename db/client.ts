import "server-only";
import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import * as schema from "./schema";

function databaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set; start the app with `npm start`.");
  return url;
}

// One pool per process; reused across hot reloads in development.
const globalForDb = globalThis as unknown as { ordwiseSql?: postgres.Sql };
export const sql = globalForDb.ordwiseSql ?? postgres(databaseUrl(), { max: 10, onnotice: () => undefined });
if (process.env.NODE_ENV !== "production") globalForDb.ordwiseSql = sql;

export const db = drizzle(sql, { schema });
export type Db = typeof db;
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
