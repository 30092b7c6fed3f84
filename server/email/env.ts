import "server-only";
import { z } from "zod";

const emailEnvSchema = z.object({
  RESEND_API_KEY: z.string().trim().min(1).optional(),
  // Unset against the real service; the local fake's URL otherwise (fakes/README.md).
  RESEND_BASE_URL: z.url({ message: "RESEND_BASE_URL must be a URL such as http://127.0.0.1:4010/resend." }).optional(),
  EMAIL_FROM: z.string().trim().min(3).default("status@baywright.example"),
  EMAIL_REPLY_TO: z.email({ message: "EMAIL_REPLY_TO must be an e-mail address." }).optional(),
  APP_URL: z.url({ message: "APP_URL must be the address customers open, such as https://status.your-shop.example." }).default("http://localhost:3000"),
  STATUS_LINK_SECRET: z.string().min(32, "STATUS_LINK_SECRET must be at least 32 characters.").optional(),
  OUTBOX_POLL_MS: z.coerce.number().int().min(200).max(600_000).default(5_000),
  // Overrides the shop's quiet period after a move (tests and scripted checks set it short).
  EMAIL_QUIET_SECONDS: z.coerce.number({ message: "EMAIL_QUIET_SECONDS must be a whole number of seconds." }).int("EMAIL_QUIET_SECONDS must be a whole number of seconds.").min(0).max(3600).optional(),
});
export type EmailEnv = z.infer<typeof emailEnvSchema>;

/** Read on use (not at import), so tests and the start-up hook see the env as it is then. */
export function emailEnv(): EmailEnv {
  const blankless = Object.fromEntries(Object.entries(process.env).filter(([, v]) => v !== ""));
  const parsed = emailEnvSchema.safeParse(blankless);
  if (!parsed.success) {
    throw new Error(`E-mail settings in the environment are not valid: ${parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
  }
  return parsed.data;
}

/** Whether stage e-mails can go out; a broken setting counts as not set up (the server log says why). */
export function emailConfigured(): boolean {
  try {
    return Boolean(emailEnv().RESEND_API_KEY);
  } catch {
    return false;
  }
}

/** Whether customers' replies go somewhere (EMAIL_REPLY_TO); only then may an e-mail or page invite one. */
export function repliesRead(): boolean {
  try {
    return Boolean(emailEnv().EMAIL_REPLY_TO);
  } catch {
    return false;
  }
}
