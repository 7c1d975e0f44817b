import type { Role } from "@/lib/auth/roles";

declare module "next-auth" {
  interface User {
    id: string;
    role: Role;
    /** users.session_version at sign-in: a session with an older value is refused (lib/session.ts). */
    sv: number;
  }
  interface Session {
    user: { id: number; email: string; name: string; role: Role; sv: number };
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    uid: number;
    role: Role;
    sv?: number;
  }
}
