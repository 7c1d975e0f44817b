import knex, { type Knex } from "knex";
import { knexConfig } from "@/knexfile";

/**
 * A connection as the database's owner (the migrations' user), for what a test must do behind
 * the application's back: tamper with the audit log, drop and create databases. The application
 * itself (lib/db.ts) connects as a user that may not.
 */
export function ownerDb(database?: string): Knex {
  return knex({ ...knexConfig(database, "owner"), pool: { min: 0, max: 2 } });
}
