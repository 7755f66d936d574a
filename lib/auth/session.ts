import { getServerSession } from "next-auth";
import { redirect } from "next/navigation";
import { ApiError } from "@/lib/api/http";
import { authOptions, type SessionUser } from "./options";
import { START_PAGE, type Role } from "./roles";

export type { SessionUser };

export async function currentUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
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
