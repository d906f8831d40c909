import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { z } from "zod";
import type { User } from "~/db/schema";
import { checkCredentials, emailSchema } from "~/models/users.server";

export const loginSchema = z.object({
  email: emailSchema,
  password: z
    .string({ error: "Enter your password" })
    .min(1, "Enter your password")
    .max(128, "That password is too long"),
  redirectTo: z.string().optional(),
});

/** Thrown by the strategy for a wrong e-mail or password; the login action shows one message for both. */
export class InvalidCredentialsError extends Error {
  constructor() {
    super("That e-mail and password do not match an account.");
  }
}

// remix-auth v4 only checks credentials; the login action stores the session
// (a database row) itself.
export const authenticator = new Authenticator<User>();

authenticator.use(
  new FormStrategy(async ({ form }) => {
    const parsed = loginSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) throw new InvalidCredentialsError();
    const user = await checkCredentials(parsed.data.email, parsed.data.password);
    if (!user) throw new InvalidCredentialsError();
    return user;
  }),
  "form",
);
