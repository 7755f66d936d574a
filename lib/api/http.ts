import { NextResponse } from "next/server";
import { ZodError, type ZodType } from "zod";
import { contentionKind, DbContentionError, isDbUnavailable } from "@/lib/db";

/** An error with an HTTP status and a message meant for the caller. */
export class ApiError extends Error {
  constructor(
    public status: number,
    message: string,
    public body: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

export function json(data: unknown, init?: number | ResponseInit) {
  return NextResponse.json(data, typeof init === "number" ? { status: init } : init);
}

/** Zod issues as `path: message`, naming the field. */
export function zodIssues(err: ZodError) {
  return err.issues.map((i) => ({
    field: i.path.length ? i.path.map(String).join(".") : "(body)",
    message: i.message,
  }));
}

export function errorResponse(err: unknown) {
  if (err instanceof ApiError) return json({ error: err.message, ...err.body }, err.status);
  if (err instanceof ZodError) {
    const issues = zodIssues(err);
    return json(
      { error: `Invalid ${issues[0]?.field}: ${issues[0]?.message}`, issues },
      422,
    );
  }
  if (err instanceof DbContentionError) return json({ error: err.message, attempts: err.attempts }, err.status);
  if (isDbUnavailable(err)) {
    return json({ error: "The database is not reachable right now; try again shortly." }, 503);
  }
  // A conflict that reached here without a retry wrapper (see transact in lib/db.ts).
  const kind = contentionKind(err);
  if (kind === "conflict") return json({ error: "Another change to the same records was saved at the same moment; nothing of this one was saved. Reload and try again." }, 409);
  if (kind === "busy") return json({ error: "The database is busy with another change to the same records; nothing was saved. Try again shortly." }, 503);
  const e = err as { code?: string } | null;
  if (e?.code === "ER_DUP_ENTRY") return json({ error: "That record already exists." }, 409);
  console.error("[api] unexpected error", err);
  return json({ error: "Something went wrong on our side; nothing was changed." }, 500);
}

type Ctx<P> = { params: Promise<P> };

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/** The origins this app is served from: the configured public URLs and the request's own. */
function ownOrigins(req: Request): Set<string> {
  const out = new Set<string>();
  for (const u of [process.env.APP_PUBLIC_URL, process.env.NEXTAUTH_URL, req.url]) {
    if (!u) continue;
    try {
      out.add(new URL(u).origin);
    } catch {
      /* not a URL: ignored */
    }
  }
  return out;
}

/**
 * Cross-site request forgery check for every state-changing request (issue 15, finding 10).
 * A browser always names the page that sent a POST/PUT/PATCH/DELETE in `Origin` (and, in
 * current browsers, says `Sec-Fetch-Site`); the write is refused with 403 unless that page is
 * this app's own origin (scheme, host and port). A request with neither header does not come
 * from a web page (scripts, the SMS provider, tests) and cannot carry a victim's cookies by
 * way of another site, so it passes to the session and role checks as before.
 */
export function checkOrigin(req: Request): void {
  if (SAFE_METHODS.has(req.method.toUpperCase())) return;
  const origin = req.headers.get("origin");
  const site = req.headers.get("sec-fetch-site");
  if (origin === null) {
    if (site && site !== "same-origin" && site !== "none") {
      throw new ApiError(403, `Refused: this change was sent from another site (Sec-Fetch-Site: ${site.slice(0, 20)}).`);
    }
    return;
  }
  if (!ownOrigins(req).has(origin)) {
    throw new ApiError(403, "Refused: this change was sent from a page that is not this app (Origin does not match).");
  }
}

export interface HandlerOptions {
  /**
   * "signed": the route proves its caller another way (the SMS webhook's provider signature)
   * and skips the Origin check. Everything else is checked.
   */
  origin?: "checked" | "signed";
}

/**
 * Wraps a route handler: the Origin check for state-changing methods (403), then every thrown
 * error becomes a JSON response with the right status.
 */
export function handler<P = Record<string, string>>(
  fn: (req: Request, ctx: Ctx<P>) => Promise<Response>,
  options: HandlerOptions = {},
) {
  return async (req: Request, ctx: Ctx<P>) => {
    try {
      if (options.origin !== "signed") checkOrigin(req);
      return await fn(req, ctx);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** The JSON body limit of readJson (a route may pass its own). */
export const MAX_JSON_BYTES = 1_000_000;

const fmtLimit = (n: number) => (n >= 1_000_000 ? `${Math.round(n / 100_000) / 10} MB` : `${Math.round(n / 1000)} kB`);

/**
 * Reads a request body as it streams in and stops at `maxBytes` (413) — also when it comes
 * chunked, without a Content-Length, or with a Content-Length that understates it. A declared
 * length over the limit is refused before a byte is read. Nothing past the limit is buffered.
 */
export async function readBodyBytes(req: Request, maxBytes: number, what = "The request body"): Promise<Uint8Array<ArrayBuffer>> {
  const tooLarge = () => new ApiError(413, `${what} is larger than ${fmtLimit(maxBytes)}.`, { limitBytes: maxBytes });
  const declared = req.headers.get("content-length");
  if (declared !== null && /^\d+$/.test(declared) && Number(declared) > maxBytes) throw tooLarge();
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => {});
      throw tooLarge();
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** The body as text, read with readBodyBytes' limit. */
export async function readBodyText(req: Request, maxBytes: number, what?: string): Promise<string> {
  return new TextDecoder().decode(await readBodyBytes(req, maxBytes, what));
}

/**
 * A multipart/form-data body read with the streaming limit first, then parsed: an upload
 * never sits in memory past `maxBytes`. 400 when it is not multipart.
 */
export async function readFormData(req: Request, maxBytes: number, what?: string): Promise<FormData> {
  const bytes = await readBodyBytes(req, maxBytes, what);
  try {
    return await new Response(bytes as Uint8Array<ArrayBuffer>, { headers: { "content-type": req.headers.get("content-type") ?? "" } }).formData();
  } catch {
    throw new ApiError(400, "Send the file as multipart/form-data with a field named file.");
  }
}

/**
 * The path of the first string (or key) that is not well-formed Unicode: JSON may escape a lone
 * surrogate ("\ud800"), which no UTF-8 column can store and MariaDB's JSON check refuses (an
 * audit row's detail), so it is turned away here. Iterative: nesting depth cannot overflow.
 */
export function malformedTextAt(value: unknown): string | null {
  const stack: [unknown, string][] = [[value, ""]];
  while (stack.length) {
    const [v, at] = stack.pop()!;
    if (typeof v === "string") {
      if (!v.isWellFormed()) return at || "(body)";
    } else if (v && typeof v === "object") {
      for (const [k, child] of Object.entries(v)) {
        const path = at ? `${at}.${k}` : k;
        if (!k.isWellFormed()) return path;
        stack.push([child, path]);
      }
    }
  }
  return null;
}

/** Reads a JSON body and validates it; 400 for unreadable JSON, 422 naming the field. */
export async function readJson<T>(req: Request, schema: ZodType<T>, maxBytes = MAX_JSON_BYTES): Promise<T> {
  let raw: unknown;
  try {
    const text = await readBodyText(req, maxBytes, "Request body");
    raw = text.length ? JSON.parse(text) : {};
  } catch (err) {
    if (err instanceof ApiError) throw err;
    throw new ApiError(400, "Request body is not valid JSON.");
  }
  const bad = malformedTextAt(raw);
  if (bad) {
    const message = "Contains text that is not valid Unicode (a lone surrogate)";
    throw new ApiError(422, `Invalid ${bad}: ${message}`, { issues: [{ field: bad, message }] });
  }
  return schema.parse(raw);
}

/** Validates URL search parameters against a schema (422 naming the parameter). */
export function readQuery<T>(req: Request, schema: ZodType<T>): T {
  const params = Object.fromEntries(new URL(req.url).searchParams.entries());
  return schema.parse(params);
}
