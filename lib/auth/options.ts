import bcrypt from "bcryptjs";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { z } from "zod";
import { db, isDbUnavailable } from "@/lib/db";
import { clientAddress } from "./client-address";
import { recordSignIn, signInGate } from "./rate-limit";
import { activeUserByEmail, createSession, liveSessionUser, revokeSession, SESSION_MAX_AGE_SECONDS } from "@/lib/users/data-sessions";
import type { Role } from "@/lib/users/roles";

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter the e-mail address you sign in with").max(254),
  password: z.string().min(1, "Enter your password").max(200),
});

export const WRONG_CREDENTIALS = "E-mail or password is not right.";
export const TOO_MANY = (seconds: number) =>
  `Too many failed sign-ins from this address. Wait ${seconds < 90 ? `${seconds} seconds` : `${Math.ceil(seconds / 60)} minutes`} and try again, or ask an admin to reset your password.`;

let dummy: string | undefined;
const dummyHash = () => (dummy ??= bcrypt.hashSync("no-such-account", 10));

/**
 * Session and CSRF cookies are always HttpOnly and SameSite=Lax (next-auth's defaults); they are
 * Secure, with the __Secure-/__Host- prefixes, whenever the public URL is https — also when TLS
 * ends at a proxy in front of `next start`. Said here rather than left to next-auth's inference
 * so tests/unit/auth-cookies.test.ts can hold it (and proxy.ts reads the same cookie name).
 */
export const useSecureCookies = (process.env.NEXTAUTH_URL ?? "").startsWith("https://");

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_SECONDS },
  useSecureCookies,
  pages: { signIn: "/login" },
  secret: process.env.NEXTAUTH_SECRET,
  events: {
    // Sign-out ends this session on the server too: the old token is refused from now on.
    async signOut({ token }) {
      if (token && typeof token.sid === "string") await revokeSession(db(), token.sid, "sign_out");
    },
  },
  providers: [
    CredentialsProvider({
      name: "Gaffline",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, req) {
        const parsed = signInSchema.safeParse(credentials ?? {});
        if (!parsed.success) throw new Error(WRONG_CREDENTIALS);
        const { email, password } = parsed.data;
        const ip = clientAddress(req?.headers as Record<string, string>);
        const conn = db();
        const gate = await signInGate(conn, email, ip);
        if (!gate.ok) throw new Error(TOO_MANY(gate.retryAfterSeconds));
        if (gate.holdMs) await new Promise((r) => setTimeout(r, gate.holdMs));
        const user = await activeUserByEmail(conn, email);
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
    // Only same-origin paths (issue 15, finding 13/15): anything else, or a URL that does not
    // parse, goes to the start page; never an exception.
    async redirect({ url, baseUrl }) {
      return safeRedirect(url, baseUrl);
    },
    async jwt({ token, user }) {
      if (user) {
        const u = user as unknown as SessionUser;
        // A server-side session for this sign-in (lib/users/data-sessions.ts).
        token.sid = await createSession(db(), Number(u.id));
        token.uid = Number(u.id);
        token.role = u.role;
        token.workerId = u.workerId;
        token.organisationId = u.organisationId;
        token.homeYardId = u.homeYardId;
      }
      return token;
    },
    async session({ session, token }) {
      // Checked on every request: a revoked or expired session, a deactivated user or a role
      // that changed since sign-in leave no user in the session (requireRole answers 401).
      let live: Awaited<ReturnType<typeof liveSessionUser>> = null;
      try {
        live =
          typeof token.sid === "string" && typeof token.uid === "number"
            ? await liveSessionUser(db(), token.sid, token.uid, String(token.role))
            : null;
      } catch (err) {
        // The session could not be checked (database down, or a frozen node's statement time-out):
        // say so, so requireRole answers 503 rather than "Sign in first" (next-auth would
        // otherwise swallow the error and return a session without a user).
        if (isDbUnavailable(err)) return { expires: session.expires, dbUnavailable: true } as typeof session;
        throw err;
      }
      if (!live) return { expires: session.expires } as typeof session;
      session.user = {
        id: token.uid as number,
        name: token.name ?? "",
        email: token.email ?? "",
        role: live.role,
        workerId: live.workerId,
        organisationId: live.organisationId,
        homeYardId: live.homeYardId,
      } as SessionUser as never;
      return session;
    },
  },
};

/**
 * Where a redirect may go: a path on this site ("/board", never "//host" or "/\\host"), or a
 * full URL of this very origin. Everything else, malformed included, is the base URL.
 */
export function safeRedirect(url: string, baseUrl: string): string {
  const path = safePath(url);
  if (path) return baseUrl.replace(/\/$/, "") + path;
  try {
    const u = new URL(url);
    if (u.origin === new URL(baseUrl).origin) return u.toString();
  } catch {
    /* not a URL */
  }
  return baseUrl;
}

/** A same-origin path, or null: starts with one "/", no "//" or "/\\" (browsers read "\\" as "/"), no control characters. */
export function safePath(p: string | null | undefined): string | null {
  if (typeof p !== "string" || p.length > 2000) return null;
  if (!p.startsWith("/") || p.startsWith("//") || p.startsWith("/\\")) return null;
  if (/[\u0000-\u001f\u007f\\]/.test(p)) return null;
  try {
    // Resolved against a dummy origin, it must stay on it.
    const u = new URL(p, "http://same.invalid");
    if (u.origin !== "http://same.invalid") return null;
    return u.pathname + u.search + u.hash;
  } catch {
    return null;
  }
}

export interface SessionUser {
  id: number;
  name: string;
  email: string;
  role: Role;
  workerId: number | null;
  organisationId: number;
  homeYardId: number | null;
}
