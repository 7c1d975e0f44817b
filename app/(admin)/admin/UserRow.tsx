"use client";

import { useActionState } from "react";
import { ROLES } from "@/lib/auth/roles";
import type { User } from "@/lib/data/users";
import { changeUserAction, type ActionResult } from "./actions";

export function UserRow({ user }: { user: Pick<User, "id" | "name" | "email" | "role" | "active" | "hasPassword"> }) {
  const [state, action, pending] = useActionState<ActionResult | null, FormData>(changeUserAction, null);
  return (
    <tr>
      <td>{user.name}</td>
      <td>{user.email}</td>
      <td>{user.hasPassword ? "set" : "invited"}</td>
      <td>
        <form action={action} className="flex flex-wrap items-center gap-2" aria-label={`Role of ${user.name}`}>
          <input type="hidden" name="id" value={user.id} />
          <select name="role" defaultValue={user.role} className="input w-auto" aria-label={`Role of ${user.email}`}>
            {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
          </select>
          <label className="flex items-center gap-1 font-normal">
            <input type="checkbox" name="active" defaultChecked={user.active} /> active
          </label>
          <button type="submit" className="btn-secondary" disabled={pending}>Save</button>
          {state && <span role="status" className={state.ok ? "text-xs text-accent-strong" : "field-error"}>{state.message}</span>}
        </form>
      </td>
    </tr>
  );
}
