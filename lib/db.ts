import knex, { type Knex } from "knex";
import { knexConfig } from "@/knexfile";
import { env } from "@/lib/env";

/** The one knex instance. Cached on globalThis outside production, so hot reload reuses the pool. */
const globalForDb = globalThis as unknown as { yawpointDb?: Knex };

export const db: Knex = globalForDb.yawpointDb ?? knex({ ...knexConfig(), pool: { min: 0, max: env.DB_POOL_MAX } });

if (process.env.NODE_ENV !== "production") globalForDb.yawpointDb = db;

/** Anything that can run a query: the instance or a transaction. */
export type Queryable = Knex | Knex.Transaction;
