import { NextResponse } from "next/server";
import { ZodError, type ZodType } from "zod";
import { isDbUnavailable } from "@/lib/db";

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
  if (isDbUnavailable(err)) {
    return json({ error: "The database is not reachable right now; try again shortly." }, 503);
  }
  const e = err as { code?: string } | null;
  if (e?.code === "ER_DUP_ENTRY") return json({ error: "That record already exists." }, 409);
  console.error("[api] unexpected error", err);
  return json({ error: "Something went wrong on our side; nothing was changed." }, 500);
}

type Ctx<P> = { params: Promise<P> };

/** Wraps a route handler: every thrown error becomes a JSON response with the right status. */
export function handler<P = Record<string, string>>(
  fn: (req: Request, ctx: Ctx<P>) => Promise<Response>,
) {
  return async (req: Request, ctx: Ctx<P>) => {
    try {
      return await fn(req, ctx);
    } catch (err) {
      return errorResponse(err);
    }
  };
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
export async function readJson<T>(req: Request, schema: ZodType<T>): Promise<T> {
  let raw: unknown;
  try {
    const text = await req.text();
    if (text.length > 1_000_000) throw new ApiError(413, "Request body is larger than 1 MB.");
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
