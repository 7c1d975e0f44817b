import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { listUsers } from "@/lib/data/users";
import { getCurrentUser } from "@/lib/session";
import { InviteForm } from "./InviteForm";
import { UserRow } from "./UserRow";

export const metadata = { title: "Users" };

export default async function AdminUsersPage() {
  requireRole(await getCurrentUser(), "admin");
  const users = await listUsers(db);
  return (
    <section className="space-y-6">
      <h1>Users and roles</h1>
      <div className="card space-y-2">
        <h2>Invite someone</h2>
        <p className="text-sm text-slate-700">They receive a single-use link, valid for one hour, to choose a password. Participants never get accounts.</p>
        <InviteForm />
      </div>
      <div className="card overflow-x-auto p-0">
        <table>
          <thead><tr><th>Name</th><th>E-mail</th><th>Password</th><th>Role and access</th></tr></thead>
          <tbody>
            {users.map((u) => <UserRow key={u.id} user={{ id: u.id, name: u.name, email: u.email, role: u.role, active: u.active, hasPassword: u.hasPassword }} />)}
          </tbody>
        </table>
      </div>
    </section>
  );
}
