import type { Knex } from "knex";

const ROLES = [
  { name: "admin", description: "Lab administrator: accounts and roles" },
  { name: "researcher", description: "Owns and edits studies, runs them, analyses and exports" },
  { name: "reviewer", description: "Ethics reviewer: reads protocols, decides on consent versions, audits" },
];

export async function up(knex: Knex): Promise<void> {
  await knex("roles").insert(ROLES);
}

export async function down(knex: Knex): Promise<void> {
  await knex("roles").whereIn("name", ROLES.map((r) => r.name)).delete();
}
