import type { Knex } from "knex";
import { parseEnv } from "./lib/env";

const env = parseEnv(process.env);

/**
 * Who connects: the application (DB_USER: reads and writes rows, may only read and append to the
 * audit log, no schema changes) or the database's owner (DB_OWNER_USER: runs the migrations).
 * scripts/db.ts creates both and grants each its rights.
 */
export type DbRole = "app" | "owner";

/** Knex configuration; lib/db.ts uses the application's, the knex CLI (migrations) the owner's. */
export function knexConfig(database: string = env.DB_NAME, as: DbRole = "app"): Knex.Config {
  return {
    client: "mysql2",
    connection: {
      host: env.DB_HOST,
      port: env.DB_PORT,
      user: as === "owner" ? env.DB_OWNER_USER : env.DB_USER,
      password: as === "owner" ? env.DB_OWNER_PASSWORD : env.DB_PASSWORD,
      database,
      charset: "utf8mb4",
      timezone: "Z",
      dateStrings: false,
    },
    pool: { min: 0, max: 10 },
    migrations: {
      directory: "./db/migrations",
      extension: "ts",
      loadExtensions: [".ts"],
      tableName: "knex_migrations",
    },
  };
}

/** The knex CLI's configuration (npm run db:migrate / db:rollback): the owner runs migrations. */
export default knexConfig(env.DB_NAME, "owner");
