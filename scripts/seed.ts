/** Seeds the demo scenario into DB_NAME and prints the demo sign-ins. */
import knex from "knex";
import { knexConfig } from "../knexfile";
import { DEMO_PEOPLE } from "../db/seeds/demo-scenario";
import { seedDemo } from "../db/seeds/demo";

const db = knex(knexConfig());
try {
  const { created } = await seedDemo(db);
  console.log(created.length ? `seed: added ${created.join(", ")}` : "seed: demo data already present");
  if (!process.argv.includes("--quiet")) {
    console.log("\nDemo sign-ins (invented people of the fictional Harbourview Interaction Lab):");
    for (const p of DEMO_PEOPLE) console.log(`  ${p.role.padEnd(10)} ${p.email.padEnd(34)} ${p.password}`);
  }
} finally {
  await db.destroy();
}
