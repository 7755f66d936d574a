import { z } from "zod";
import { ROLES, type Role } from "@/lib/users/roles";

// User management (issue 18, point 6) and passwords (issue 15). Shared by routes and forms.

/** At least 12 characters, not all one character class: long beats clever (NIST SP 800-63B §5.1.1.2 asks for ≥ 8 and no composition rules; 12 is our choice). */
export const newPassword = (field = "password") =>
  z
    .string({ error: `${field} is required` })
    .min(12, "Use at least 12 characters")
    .max(200, "Use at most 200 characters")
    .refine((p) => new Set(p).size >= 5, "Use more than a few different characters");

const yardIds = z.array(z.number().int().positive()).max(50).default([]);

export const userCreateSchema = z
  .object({
    email: z.string({ error: "email is required" }).trim().toLowerCase().email("Enter an e-mail address").max(254),
    name: z.string({ error: "name is required" }).trim().min(2, "Enter the person's name").max(160),
    role: z.enum(ROLES, { error: "Pick a role" }),
    yardIds,
    workerId: z.number().int().positive().nullable().default(null),
  })
  .superRefine((v, ctx) => {
    if (v.role === "lineworker" && !v.workerId) ctx.addIssue({ code: "custom", path: ["workerId"], message: "A lineworker signs in as a worker: pick the worker" });
    if (v.role !== "lineworker" && v.workerId) ctx.addIssue({ code: "custom", path: ["workerId"], message: "Only a lineworker is linked to a worker" });
    if (v.role === "dispatcher" && !v.yardIds.length) ctx.addIssue({ code: "custom", path: ["yardIds"], message: "A dispatcher needs at least one yard" });
  });

export const userPatchSchema = z.object({
  role: z.enum(ROLES, { error: "Pick a role" }).optional(),
  yardIds: z.array(z.number().int().positive()).max(50).optional(),
  active: z.boolean().optional(),
  workerId: z.number().int().positive().nullable().optional(),
});

export const passwordChangeSchema = z
  .object({
    currentPassword: z.string({ error: "currentPassword is required" }).min(1, "Enter your current password").max(200),
    newPassword: newPassword("newPassword"),
    confirm: z.string().max(200).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.confirm !== undefined && v.confirm !== v.newPassword) ctx.addIssue({ code: "custom", path: ["confirm"], message: "The two new passwords differ" });
    if (v.currentPassword === v.newPassword) ctx.addIssue({ code: "custom", path: ["newPassword"], message: "Pick a password different from the current one" });
  });

export const passwordResetSchema = z.object({
  token: z.string({ error: "token is required" }).regex(/^[A-Za-z0-9_-]{20,100}$/, "This reset link is not valid"),
  password: newPassword("password"),
});

export type UserCreate = z.infer<typeof userCreateSchema>;
export type UserPatch = z.infer<typeof userPatchSchema>;

export interface UserView {
  id: number;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  workerId: number | null;
  workerName: string | null;
  yardIds: number[];
  createdAt: string;
}
