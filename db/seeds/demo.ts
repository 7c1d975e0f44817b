import type { Knex } from "knex";
import { hashPassword } from "../../lib/auth/password";
import { appendAudit } from "../../lib/data/audit";
import { addTeamMember, insertStudy } from "../../lib/data/studies";
import { findUserRowByEmail, insertUser } from "../../lib/data/users";
import { DEMO_PEOPLE, DEMO_STUDY } from "./demo-scenario";
import { seedFinishedStudy } from "./demo-finished-study";

/** Seeds the demo lab; idempotent (adds only what is missing), so every `npm start` may run it. */
export async function seedDemo(db: Knex): Promise<{ created: string[] }> {
  const created: string[] = [];
  const ids = new Map<string, number>();
  for (const p of DEMO_PEOPLE) {
    const existing = await findUserRowByEmail(db, p.email);
    if (existing) {
      ids.set(p.email, existing.id);
      continue;
    }
    const id = await insertUser(db, { email: p.email, name: p.name, role: p.role, passwordHash: await hashPassword(p.password) });
    ids.set(p.email, id);
    created.push(`user ${p.email}`);
  }
  const ownerId = ids.get(DEMO_STUDY.ownerEmail);
  if (ownerId === undefined) throw new Error("seedDemo: the demo owner is missing");
  const study = await db("studies").where({ title: DEMO_STUDY.title }).first<{ id: number } | undefined>("id");
  if (!study) {
    const studyId = await insertStudy(db, { title: DEMO_STUDY.title, summary: DEMO_STUDY.summary, protocolNumber: DEMO_STUDY.protocolNumber, ownerId });
    for (const m of DEMO_STUDY.team) {
      const uid = ids.get(m.email);
      if (uid !== undefined) await addTeamMember(db, studyId, uid, m.role);
    }
    await appendAudit(db, { actorUserId: null, actorLabel: "system", action: "study.create", studyId, details: { title: DEMO_STUDY.title, seeded: true } });
    created.push(`study "${DEMO_STUDY.title}"`);
  }
  created.push(...(await seedFinishedStudy(db, ids)));
  return { created };
}
