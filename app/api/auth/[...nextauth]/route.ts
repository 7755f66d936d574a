import NextAuth from "next-auth";
import { authOptions, safePath } from "@/lib/auth/options";

const nextAuth = NextAuth(authOptions);

/** A callback URL that is a same-origin path or an http(s) URL; anything else is malformed. */
function wellFormed(v: string): boolean {
  if (safePath(v)) return true;
  try {
    const u = new URL(v);
    return u.protocol === "http:" || u.protocol === "https:";
  } catch {
    return false;
  }
}

/**
 * The callback URL in the query or in next-auth's cookie, when malformed (issue 15, finding
 * 15): named, for a 400. A well-formed URL of another site is not an error here: the redirect
 * callback (lib/auth/options.ts) sends it to the start page instead.
 */
function malformedCallback(req: Request): string | null {
  const q = new URL(req.url).searchParams.get("callbackUrl");
  if (q !== null && !wellFormed(q)) return "callbackUrl";
  for (const part of (req.headers.get("cookie") ?? "").split(";")) {
    const i = part.indexOf("=");
    if (i < 0) continue;
    const name = part.slice(0, i).trim();
    if (!/(^|\.|-)next-auth\.callback-url$/.test(name)) continue;
    let value: string;
    try {
      value = decodeURIComponent(part.slice(i + 1).trim());
    } catch {
      return `cookie ${name}`;
    }
    if (!wellFormed(value)) return `cookie ${name}`;
  }
  return null;
}

// next-auth's own routes: its CSRF token guards their POSTs (so handler()'s Origin check is
// not applied); a malformed callback URL is refused with 400 before next-auth sees it.
async function route(req: Request, ctx: { params: Promise<{ nextauth: string[] }> }) {
  const bad = malformedCallback(req);
  if (bad) return Response.json({ error: `Invalid ${bad}: not a path on this site or a web address.` }, { status: 400 });
  return nextAuth(req, ctx);
}

export { route as GET, route as POST };
