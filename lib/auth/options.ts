import bcrypt from "bcryptjs";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { z } from "zod";
import { db } from "@/lib/db";
import { recordSignIn, signInBlocked, SIGN_IN_LIMIT } from "./rate-limit";
import type { Role } from "./roles";

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter the e-mail address you sign in with").max(254),
  password: z.string().min(1, "Enter your password").max(200),
});

export const WRONG_CREDENTIALS = "E-mail or password is not right.";
export const TOO_MANY = `Too many failed sign-ins. Wait ${SIGN_IN_LIMIT.windowMinutes} minutes and try again, or ask an admin.`;

let dummy: string | undefined;
const dummyHash = () => (dummy ??= bcrypt.hashSync("no-such-account", 10));

function clientIp(headers: Record<string, string | string[] | undefined> | undefined) {
  const fwd = headers?.["x-forwarded-for"];
  const first = (Array.isArray(fwd) ? fwd[0] : fwd)?.split(",")[0]?.trim();
  return (first || (headers?.["x-real-ip"] as string) || "local").slice(0, 64);
}

/**
 * Session and CSRF cookies are always HttpOnly and SameSite=Lax (next-auth's defaults); they are
 * Secure, with the __Secure-/__Host- prefixes, whenever the public URL is https — also when TLS
 * ends at a proxy in front of `next start`. Said here rather than left to next-auth's inference
 * so tests/unit/auth-cookies.test.ts can hold it (and proxy.ts reads the same cookie name).
 */
export const useSecureCookies = (process.env.NEXTAUTH_URL ?? "").startsWith("https://");

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  useSecureCookies,
  pages: { signIn: "/login" },
  secret: process.env.NEXTAUTH_SECRET,
  providers: [
    CredentialsProvider({
      name: "Gaffline",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, req) {
        const parsed = signInSchema.safeParse(credentials ?? {});
        if (!parsed.success) throw new Error(WRONG_CREDENTIALS);
        const { email, password } = parsed.data;
        const ip = clientIp(req?.headers as Record<string, string>);
        const conn = db();
        if (await signInBlocked(conn, email, ip)) throw new Error(TOO_MANY);
        const user = await conn("users").where({ email, active: true }).first();
        // Compare against a fixed hash when the account is unknown, so timing does not tell.
        const ok = await bcrypt.compare(password, user?.password_hash ?? dummyHash());
        await recordSignIn(conn, email, ip, Boolean(user && ok));
        if (!user || !ok) throw new Error(WRONG_CREDENTIALS);
        return {
          id: String(user.id),
          name: user.name,
          email: user.email,
          role: user.role as Role,
          workerId: user.worker_id ?? null,
          organisationId: user.organisation_id,
          homeYardId: user.home_yard_id ?? null,
        };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        const u = user as unknown as SessionUser;
        token.uid = Number(u.id);
        token.role = u.role;
        token.workerId = u.workerId;
        token.organisationId = u.organisationId;
        token.homeYardId = u.homeYardId;
      }
      return token;
    },
    async session({ session, token }) {
      session.user = {
        id: token.uid as number,
        name: token.name ?? "",
        email: token.email ?? "",
        role: token.role as Role,
        workerId: (token.workerId as number | null) ?? null,
        organisationId: token.organisationId as number,
        homeYardId: (token.homeYardId as number | null) ?? null,
      } as SessionUser as never;
      return session;
    },
  },
};

export interface SessionUser {
  id: number;
  name: string;
  email: string;
  role: Role;
  workerId: number | null;
  organisationId: number;
  homeYardId: number | null;
}
