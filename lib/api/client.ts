// The one way the browser writes to (and reads from) the app's JSON routes. Client-safe: no
// server imports. Screens use it through `useApiMutation` (lib/api/mutations.ts) or, outside a
// React Query provider, `apiFetch` + `placeFailure` directly.
//
//   apiFetch<T>(url, { method, body, signal })  → the parsed JSON body; throws ApiFailure when
//                                                  the answer is not 2xx (or nothing answered)
//   ApiFailure { status, message, issues, body, conflict (409), invalid (422), unreachable (0) }
//   placeFailure(form, failure)                 → puts the issues (422, or a 409 that names a
//                                                  field) on react-hook-form fields with
//                                                  setError; returns the sentence for the alert
//   apiUpload(url, body, onProgress)            → the same, with upload progress (XMLHttpRequest)
//   sendJson(url, method, body)                 → the older never-throwing shape { ok, status,
//                                                  body }, kept for the board, fill panel and
//                                                  briefing screens until they move over
//
// The routes' error shape (lib/api/http.ts `errorResponse`): `{ error, issues?: [{ field,
// message }], current?, … }`: 422 from `readJson` names each bad field by its dotted path
// ("positions.0.position"); 409 is a stale or clashing write, sometimes with `issues` (a taken
// employee number) and usually with `current`.


export interface FieldIssue {
  field: string;
  message: string;
}

export type ErrorBody = { error?: string; issues?: FieldIssue[]; current?: unknown } & Record<string, unknown>;

export const UNREACHABLE = "The server could not be reached. Check the connection and try again.";

/** A route's refusal (or no answer at all, status 0), with the body it sent. */
export class ApiFailure extends Error {
  readonly status: number;
  readonly issues: FieldIssue[];
  readonly body: ErrorBody;
  constructor(status: number, body: ErrorBody) {
    super(typeof body.error === "string" && body.error ? body.error : defaultMessage(status));
    this.name = "ApiFailure";
    this.status = status;
    this.body = body;
    this.issues = Array.isArray(body.issues) ? body.issues.filter((i): i is FieldIssue => Boolean(i) && typeof i.field === "string" && typeof i.message === "string") : [];
  }
  /** Someone else saved first, or the write clashes with what is stored: reload and look. */
  get conflict() {
    return this.status === 409;
  }
  get invalid() {
    return this.status === 422;
  }
  get unreachable() {
    return this.status === 0;
  }
}

function defaultMessage(status: number) {
  if (status === 0) return UNREACHABLE;
  if (status === 409) return "Someone else changed this since you opened it. Reload and try again.";
  if (status === 422) return "Check the fields marked.";
  return `Not done (the server answered ${status}).`;
}

export interface ApiInit {
  method?: string;
  /** A plain value is sent as JSON; FormData (uploads) as it is. */
  body?: unknown;
  signal?: AbortSignal;
  headers?: Record<string, string>;
}

async function readBody(res: Response): Promise<unknown> {
  const text = await res.text();
  if (!text) return null;
  try {
    return JSON.parse(text);
  } catch {
    return { error: text.slice(0, 200) };
  }
}

/** One round trip: the status (0 when nothing answered) and the parsed body. */
async function exchange(url: string, init: ApiInit): Promise<{ status: number; ok: boolean; body: unknown }> {
  const { method = init.body === undefined ? "GET" : "POST", body, signal, headers = {} } = init;
  const isForm = typeof FormData !== "undefined" && body instanceof FormData;
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      signal,
      cache: "no-store",
      headers: body === undefined || isForm ? headers : { "content-type": "application/json", ...headers },
      body: body === undefined ? undefined : isForm ? (body as FormData) : JSON.stringify(body),
    });
  } catch (err) {
    if ((err as { name?: string })?.name === "AbortError") throw err;
    return { status: 0, ok: false, body: { error: UNREACHABLE } };
  }
  return { status: res.status, ok: res.ok, body: await readBody(res) };
}

/** fetch() a route; resolves with its JSON body on 2xx, throws ApiFailure otherwise. */
export async function apiFetch<T = unknown>(url: string, init: ApiInit = {}): Promise<T> {
  const r = await exchange(url, init);
  if (!r.ok) throw new ApiFailure(r.status, r.body && typeof r.body === "object" ? (r.body as ErrorBody) : {});
  return r.body as T;
}

/**
 * A JSON POST that reports its upload progress (XMLHttpRequest does; fetch does not), with the
 * same answers as apiFetch: the body on 2xx, ApiFailure otherwise.
 */
export function apiUpload<T = unknown>(url: string, body: unknown, onProgress: (fraction: number) => void, method = "POST"): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(method, url);
    xhr.setRequestHeader("content-type", "application/json");
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => {
      let parsed: unknown = null;
      try {
        parsed = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        parsed = { error: xhr.responseText.slice(0, 200) };
      }
      if (xhr.status >= 200 && xhr.status < 300) resolve(parsed as T);
      else reject(new ApiFailure(xhr.status, parsed && typeof parsed === "object" ? (parsed as ErrorBody) : {}));
    };
    xhr.onerror = () => reject(new ApiFailure(0, { error: UNREACHABLE }));
    xhr.send(JSON.stringify(body));
  });
}

/** Any thrown value as an ApiFailure (a programming error becomes status -1 with its message). */
export function asFailure(err: unknown): ApiFailure {
  if (err instanceof ApiFailure) return err;
  return new ApiFailure(-1, { error: err instanceof Error ? err.message : "Not done." });
}

/** The part of a react-hook-form the mapping needs (`form` itself fits). */
export interface IssueTarget {
  // a method, so any react-hook-form's setError (typed by its own field names) fits
  setError(name: any, error: { type: string; message: string }): void;
}

export interface Placed {
  /**
   * The sentence for the form's alert: the first placed issue's own words when an issue went on a
   * field (the field shows it too), else the route's `error` (which names the field by its code).
   */
  message: string;
  /** The fields that got a message of their own. */
  fields: string[];
  conflict: boolean;
}

/**
 * Puts a failure on the form: every issue of a 422 (and of a 409 that names a field, like a
 * taken employee number) goes on its field with `setError(field, { type: "server" })`. The field
 * path is the route's (dotted, as zod and react-hook-form both write it). `only` limits it to the
 * fields the form shows; the rest stay in the alert's sentence.
 */
export function placeFailure(form: IssueTarget | null | undefined, failure: ApiFailure, only?: readonly string[]): Placed {
  const fields: string[] = [];
  if (form && (failure.status === 422 || failure.status === 409)) {
    for (const issue of failure.issues) {
      if (!issue.field || issue.field === "(body)") continue;
      if (only && !only.some((f) => issue.field === f || issue.field.startsWith(`${f}.`))) continue;
      try {
        form.setError(issue.field, { type: "server", message: issue.message });
        fields.push(issue.field);
      } catch {
        // a field the form does not know: the alert's sentence still says it
      }
    }
  }
  const first = fields.length ? failure.issues.find((i) => i.field === fields[0]) : undefined;
  return { message: first?.message ?? failure.message, fields, conflict: failure.conflict };
}

/** Old shape for screens not yet moved to apiFetch: never throws, the status says. */
export interface JsonResult<T = any> {
  ok: boolean;
  status: number;
  body: T;
}

export async function sendJson<T = any>(url: string, method: string, body?: unknown): Promise<JsonResult<T>> {
  const r = await exchange(url, { method, body });
  if (r.ok) return { ok: true, status: r.status, body: r.body as T };
  const f = new ApiFailure(r.status, r.body && typeof r.body === "object" ? (r.body as ErrorBody) : {});
  return { ok: false, status: r.status, body: { ...f.body, error: f.message } as T };
}
