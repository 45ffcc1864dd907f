import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '@loamline/shared-types';
import { z } from '@/lib/zod';

/** The server's limits (shared-types): NIST SP 800-63B's minimum and more, room for passphrases. */
export const PASSWORD_MIN = PASSWORD_MIN_LENGTH;
export const PASSWORD_MAX = PASSWORD_MAX_LENGTH;

export const emailField = z.pipe(
  z.string().check(z.trim(), z.minLength(1, 'Enter your e-mail address.')),
  z.email('That does not look like an e-mail address.'),
);

export const passwordField = z
  .string()
  .check(
    z.minLength(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`),
    z.maxLength(PASSWORD_MAX, `Use at most ${PASSWORD_MAX} characters.`),
  );

export const nameField = z
  .string()
  .check(z.trim(), z.minLength(1, 'Enter your name.'), z.maxLength(100, 'Keep it under 100 characters.'));

export const signInSchema = z.object({
  email: emailField,
  password: z.string().check(z.minLength(1, 'Enter your password.')),
});

export const registerSchema = z.object({ name: nameField, email: emailField, password: passwordField });

export const forgotPasswordSchema = z.object({ email: emailField });

export const resetPasswordSchema = z
  .object({ password: passwordField, repeat: z.string() })
  .check(
    z.refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords differ.' }),
  );

export const joinSchema = z.object({ name: nameField, password: passwordField });

export type SignInValues = z.infer<typeof signInSchema>;
export type RegisterValues = z.infer<typeof registerSchema>;
export type ForgotPasswordValues = z.infer<typeof forgotPasswordSchema>;
export type ResetPasswordValues = z.infer<typeof resetPasswordSchema>;
export type JoinValues = z.infer<typeof joinSchema>;
