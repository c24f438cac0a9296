import { z } from "zod";

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: "Enter an e-mail address like name@example.org" }).max(254));

// Length over composition rules: NIST SP 800-63B §5.1.1.2 asks for at least 8 characters and no
// composition rules; 72 bytes is bcrypt's input limit.
export const passwordSchema = z
  .string()
  .min(10, "Use at least 10 characters")
  .max(72, "Use at most 72 characters");

export const personNameSchema = z.string().trim().min(1, "Enter your name").max(120, "At most 120 characters");
export const crewNameSchema = z.string().trim().min(2, "Give the crew a name").max(120, "At most 120 characters");

export const signUpSchema = z.object({
  name: personNameSchema,
  email: emailSchema,
  password: passwordSchema,
  crewName: crewNameSchema,
});

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, "Enter your password").max(200),
});

export const forgotPasswordSchema = z.object({ email: emailSchema });

export const resetPasswordSchema = z
  .object({
    token: z.string().min(20).max(200),
    password: passwordSchema,
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ" });

export const acceptInvitationSchema = z.object({
  token: z.string().min(20).max(200),
  name: personNameSchema.optional(),
  password: passwordSchema.optional(),
});

export type SignUpInput = z.infer<typeof signUpSchema>;

export const profileSchema = z.object({
  name: personNameSchema,
  units: z.enum(["metric", "imperial"]),
  // A checkbox is absent from the form when unticked.
  alertEmails: z.preprocess((v) => v === "on" || v === "true", z.boolean()),
});
