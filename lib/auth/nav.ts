import { fakesEnabled } from "@/lib/notify/config";
import type { Role } from "@/lib/users/roles";

export interface NavItem {
  href: string;
  label: string;
  roles: Role[];
  /** Shown only while the local SMS and e-mail fakes are on (FAKES_ENABLED=1). */
  fakesOnly?: boolean;
}

// One list; each user sees the entries for their role, in this order.
export const NAV: NavItem[] = [
  { href: "/board", label: "Board", roles: ["dispatcher", "supervisor", "admin"] },
  { href: "/me", label: "My week", roles: ["lineworker"] },
  { href: "/orders", label: "Orders", roles: ["dispatcher", "supervisor", "admin"] },
  { href: "/equipment", label: "Equipment", roles: ["dispatcher", "supervisor", "admin", "hr", "lineworker"] },
  { href: "/rotations", label: "Rotations", roles: ["dispatcher", "supervisor", "hr"] },
  { href: "/messages", label: "Messages", roles: ["dispatcher", "supervisor"] },
  { href: "/credentials", label: "Credentials", roles: ["hr", "admin", "supervisor"] },
  { href: "/roster", label: "Roster", roles: ["hr", "admin", "dispatcher", "supervisor"] },
  { href: "/leave", label: "Leave", roles: ["hr", "supervisor", "dispatcher", "admin", "lineworker"] },
  { href: "/time", label: "Time", roles: ["dispatcher", "supervisor", "hr", "admin", "lineworker"] },
  { href: "/queue", label: "Queue", roles: ["supervisor"] },
  { href: "/audit", label: "Audit", roles: ["supervisor", "admin"] },
  { href: "/admin", label: "Admin", roles: ["admin"] },
  { href: "/phone", label: "Phone simulator", roles: ["dispatcher", "supervisor", "admin"], fakesOnly: true },
];

export function navFor(role: Role, fakesOn = fakesEnabled()) {
  return NAV.filter((n) => n.roles.includes(role) && (!n.fakesOnly || fakesOn));
}
