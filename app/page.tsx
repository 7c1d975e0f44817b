import { redirect } from "next/navigation";
import { ROLE_HOME } from "@/lib/auth/roles";
import { getCurrentUser } from "@/lib/session";

export default async function Home() {
  const user = await getCurrentUser();
  redirect(user ? ROLE_HOME[user.role] : "/signin");
}
