import type { Knex } from "knex";
import { parseEnv } from "./lib/env";

const env = parseEnv(process.env);

/** Knex configuration; the CLI (migrations) and lib/db.ts both use it. */
export function knexConfig(database: string = env.DB_NAME): Knex.Config {
  return {
    client: "mysql2",
    connection: {
      host: env.DB_HOST,
      port: env.DB_PORT,
      user: env.DB_USER,
      password: env.DB_PASSWORD,
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

export default knexConfig();
