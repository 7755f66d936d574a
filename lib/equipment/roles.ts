import { ROLES, type Role } from "@/lib/users/roles";

/** Who edits the equipment register (issue 16): dispatcher, supervisor, admin. */
export const CAN_EDIT_EQUIPMENT: Role[] = ["dispatcher", "supervisor", "admin"];
/** Every signed-in role reads it. */
export const ALL_SIGNED_IN: Role[] = [...ROLES];
