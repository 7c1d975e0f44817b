import knex, { type Knex } from "knex";
import { knexConfig } from "@/knexfile";

/** The one knex instance. Cached on globalThis outside production, so hot reload reuses the pool. */
const globalForDb = globalThis as unknown as { yawpointDb?: Knex };

export const db: Knex = globalForDb.yawpointDb ?? knex(knexConfig());

if (process.env.NODE_ENV !== "production") globalForDb.yawpointDb = db;

/** Anything that can run a query: the instance or a transaction. */
export type Queryable = Knex | Knex.Transaction;
