export const ROLES = ["admin", "dispatcher", "supervisor", "hr", "lineworker"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABEL: Record<Role, string> = {
  admin: "Admin",
  dispatcher: "Dispatcher",
  supervisor: "Supervisor",
  hr: "HR",
  lineworker: "Lineworker",
};

/** Where each role lands after signing in. */
export const START_PAGE: Record<Role, string> = {
  admin: "/admin",
  dispatcher: "/board",
  supervisor: "/board",
  hr: "/credentials",
  lineworker: "/me",
};

/** Role groups used by routes and pages. */
export const CAN_DISPATCH: Role[] = ["dispatcher", "supervisor"];
export const CAN_OVERRIDE: Role[] = ["supervisor"];
export const CAN_KEEP_CREDENTIALS: Role[] = ["hr", "admin"];
