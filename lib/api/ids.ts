import { ApiError } from "@/lib/api/http";

/** A numeric id from a route segment; 404 for anything else. */
export function idParam(raw: string | undefined, what = "record"): number {
  if (!raw || !/^\d{1,10}$/.test(raw)) throw new ApiError(404, `No such ${what}.`);
  const n = Number(raw);
  if (!Number.isSafeInteger(n) || n <= 0) throw new ApiError(404, `No such ${what}.`);
  return n;
}
