// Creates the database if missing, applies the drizzle-kit migrations in migrations/, then seeds.
import { drizzle } from "drizzle-orm/postgres-js";
import { migrate } from "drizzle-orm/postgres-js/migrator";
import postgres from "postgres";
import * as schema from "@/db/schema";
import { seed } from "@/db/seed";

const url = process.env.DATABASE_URL;
if (!url) throw new Error("DATABASE_URL is not set");
const target = new URL(url);
const dbName = target.pathname.slice(1);

const adminUrl = new URL(url);
adminUrl.pathname = "/postgres";
const admin = postgres(adminUrl.toString(), { max: 1, onnotice: () => undefined });
const exists = await admin`select 1 from pg_database where datname = ${dbName}`;
if (exists.length === 0) await admin.unsafe(`create database "${dbName.replace(/"/g, '""')}"`);
await admin.end();

const sql = postgres(url, { max: 1, onnotice: () => undefined });
const db = drizzle(sql, { schema });
await migrate(db, { migrationsFolder: "migrations" });
await seed(db);
await sql.end();
