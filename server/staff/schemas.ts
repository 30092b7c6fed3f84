import { z } from "zod";
import { ROLES } from "@/db/schema";

export const email = z
  .string()
  .trim()
  .toLowerCase()
  .max(200, "E-mail is too long.")
  .pipe(z.email({ message: "Enter an e-mail address like name@shop.example." }));

export const password = z
  .string()
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.");

export const personName = z.string().trim().min(1, "Enter a name.").max(80, "Keep the name under 80 characters.");

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().min(1, "Enter your e-mail.").max(200, "E-mail is too long."),
  password: z.string().min(1, "Enter your password.").max(200, "Password is too long."),
});

export const newStaffSchema = z.object({
  name: personName,
  email,
  role: z.enum(ROLES, { message: "Choose owner, office or tech." }),
  password,
});

export const staffPatchSchema = z
  .object({
    name: personName.optional(),
    role: z.enum(ROLES, { message: "Choose owner, office or tech." }).optional(),
    active: z.boolean().optional(),
    password: password.optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: "Say what to change: name, role, active or password." });

export const firstRunSchema = z.object({
  shopName: z.string().trim().min(1, "Enter the shop's name.").max(80, "Keep the shop name under 80 characters."),
  shopPhone: z.string().trim().max(30, "Keep the phone number under 30 characters.").default(""),
  name: personName,
  email,
  password,
});

export const passwordChangeSchema = z.object({
  currentPassword: z.string().min(1, "Enter your current password.").max(200),
  newPassword: password,
});
