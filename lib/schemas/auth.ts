import { z } from "zod";

const email = z.email({ error: "Enter a valid e-mail address." }).trim().toLowerCase().max(254);
const password = z
  .string()
  .min(8, "Use at least 8 characters.")
  .max(128, "Use at most 128 characters.");

export const signUpSchema = z.object({
  name: z.string().trim().min(1, "Tell us your name.").max(80, "Keep it to 80 characters or fewer."),
  email,
  password,
});
export const signInSchema = z.object({ email, password: z.string().min(1, "Enter your password.") });
export const forgotPasswordSchema = z.object({ email });
export const resetPasswordSchema = z
  .object({ password, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { message: "The two passwords differ.", path: ["confirm"] });
export const changeNameSchema = z.object({ name: signUpSchema.shape.name });
export const changePasswordSchema = z
  .object({ currentPassword: z.string().min(1, "Enter your current password."), newPassword: password })
  .refine((v) => v.currentPassword !== v.newPassword, { message: "Choose a new password.", path: ["newPassword"] });
