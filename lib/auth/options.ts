import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { users } from "@/db/schema";
import { getUserByEmail, toSessionUser } from "@/db/queries/users";
import { verifyPassword } from "./password";

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  pages: { signIn: "/login" },
  providers: [
    CredentialsProvider({
      name: "Email and password",
      credentials: { email: { label: "Email", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials) {
        const email = credentials?.email?.trim().toLowerCase();
        const password = credentials?.password ?? "";
        if (!email || !password) return null;
        const user = await getUserByEmail(email);
        if (!user || !user.active) return null;
        if (!(await verifyPassword(password, user.passwordHash))) return null;
        await db().update(users).set({ lastSignInAt: new Date() }).where(eq(users.id, user.id));
        const s = toSessionUser(user);
        return { id: String(s.id), email: s.email, name: s.name, role: s.role };
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        const role = (user as { role?: typeof token.role }).role;
        if (role) token.role = role;
        token.uid = Number(user.id);
      }
      return token;
    },
    session({ session, token }) {
      if (session.user) {
        session.user.id = token.uid;
        session.user.role = token.role;
      }
      return session;
    },
  },
};
