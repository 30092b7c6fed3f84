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

// A password is never set here: the owner's reset hands out a temporary one (POST
// /api/staff/[id]/password-reset) and each person chooses their own on /account.
export const staffPatchSchema = z
  .strictObject(
    {
      name: personName.optional(),
      role: z.enum(ROLES, { message: "Choose owner, office or tech." }).optional(),
      active: z.boolean({ error: "Send active: true or false." }).optional(),
    },
    { error: (issue) => (issue.code === "unrecognized_keys" ? "Only a name, role or active can be changed here; reset a password with Reset password." : undefined) },
  )
  .refine((v) => Object.keys(v).length > 0, { message: "Say what to change: name, role or active." });

export const firstRunSchema = z.object({
  shopName: z.string().trim().min(1, "Enter the shop's name.").max(80, "Keep the shop name under 80 characters."),
  shopPhone: z.string().trim().max(30, "Keep the phone number under 30 characters.").default(""),
  name: personName,
  email,
  password,
});

export const passwordChangeSchema = z.object({
  currentPassword: z.string({ error: "Enter your current password." }).min(1, "Enter your current password.").max(200, "Use at most 200 characters."),
  newPassword: z.string({ error: "Enter a new password." }).pipe(password),
  confirmPassword: z.string({ error: "Type the new password again." }).min(1, "Type the new password again.").max(200, "Use at most 200 characters."),
});
