import { getServerSession } from "next-auth";
import { redirect } from "next/navigation";
import { ApiError } from "@/lib/api/http";
import { db } from "@/lib/db";
import { authOptions, type SessionUser } from "./options";
import { userYardIds } from "@/lib/users/data-sessions";
import { yardNameById } from "@/lib/yards/data";
import { START_PAGE, type Role } from "@/lib/users/roles";

export type { SessionUser };

export async function currentUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  // Set by the session callback when the database could not check the session (lib/auth/options.ts).
  if ((session as { dbUnavailable?: boolean } | null)?.dbUnavailable) {
    throw new ApiError(503, "The database is not reachable right now; try again shortly.");
  }
  return (session?.user as SessionUser | undefined) ?? null;
}

/**
 * The first call of every route handler and server action: 401 when signed out,
 * 403 when the role is not among those allowed.
 */
export async function requireRole(...roles: Role[]): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw new ApiError(401, "Sign in first.");
  if (roles.length && !roles.includes(user.role)) {
    throw new ApiError(403, `This needs the ${roles.join(" or ")} role.`);
  }
  return user;
}

/** For pages: sends signed-out users to /login and others to their own start page. */
export async function requirePageRole(...roles: Role[]): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/login");
  if (roles.length && !roles.includes(user.role)) redirect(`/forbidden?from=${START_PAGE[user.role]}`);
  return user;
}

// --- Yard scope (issue 15, finding 9) ----------------------------------------------------------
// A dispatcher edits only the yards assigned to them (user_yards); supervisors and admins edit
// every yard. Any dispatcher may READ another yard's board (to borrow a crew), but not the
// contact details (phone, e-mail) or message threads of another yard's workers.
//
// In a route: `await requireYardAccess(user, yardId, "edit")` before a write that touches a
// yard's orders, assignments, overrides, sends, leave, time or rotations; "contact" before
// showing a worker's phone/e-mail or texts; "read" for the board. 403 naming the yard.

export type YardAccess = "edit" | "read" | "contact";

const ALL_YARDS: Role[] = ["supervisor", "admin"];

/**
 * The yard ids this user may edit, or "all". Only dispatchers are limited to yards; for every
 * other role the role checks decide (hr keeps every yard's time and leave, a lineworker only
 * their own records).
 */
export async function editableYards(user: SessionUser): Promise<number[] | "all"> {
  if (ALL_YARDS.includes(user.role) || user.role !== "dispatcher") return "all";
  return userYardIds(db(), user.id);
}

/** Whether the user may see phone, e-mail and texts of a yard's workers. */
export async function contactYards(user: SessionUser): Promise<number[] | "all"> {
  return editableYards(user);
}

export async function canAccessYard(user: SessionUser, yardId: number, mode: YardAccess): Promise<boolean> {
  if (mode === "read") return true;
  const yards = mode === "edit" ? await editableYards(user) : await contactYards(user);
  return yards === "all" || yards.includes(Number(yardId));
}

/** 403 unless the user may `mode` the yard (after requireRole). */
export async function requireYardAccess(user: SessionUser, yardId: number | null | undefined, mode: YardAccess): Promise<void> {
  if (yardId === null || yardId === undefined) return;
  if (await canAccessYard(user, yardId, mode)) return;
  const yard = await yardNameById(db(), yardId);
  const what = mode === "edit" ? "change the work of" : "see contact details or messages of";
  throw new ApiError(403, `You cannot ${what} ${yard?.name ?? "that yard"}: it is not one of your yards.`, { reason: "yard_scope", yardId });
}

/** Each yard id once, checked in turn (a write touching two yards needs both). */
export async function requireYardsAccess(user: SessionUser, yardIds: Iterable<number | null | undefined>, mode: YardAccess): Promise<void> {
  for (const id of new Set([...yardIds].filter((v): v is number => v !== null && v !== undefined).map(Number))) {
    await requireYardAccess(user, id, mode);
  }
}
