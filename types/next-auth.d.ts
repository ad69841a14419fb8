import type { Role } from "@/db/schema";

declare module "next-auth" {
  interface Session {
    user: { id: number; email: string; name: string; role: Role };
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    uid: number;
    role: Role;
  }
}
