import { z } from 'zod';
import { isTimeZone } from '../time-zones';

export const emailSchema = z
  .string({ error: 'Enter your e-mail address' })
  .trim()
  .max(254, 'That e-mail address is too long')
  .pipe(z.email({ error: 'Enter an e-mail address such as name@example.com' }));

// Length beats character rules for strength; bcrypt reads at most 72 bytes.
export const passwordSchema = z
  .string({ error: 'Enter a password' })
  .min(10, 'Use at least 10 characters')
  .max(72, 'Use at most 72 characters');

/**
 * Names people and studios give themselves are put into e-mails Basted sends to others
 * (invitations): they may not carry a web or e-mail address, so a name cannot pass off a link.
 */
const LINK_LIKE = /(:\/\/|www\.|@|\b[\p{L}\p{N}-]+\.[a-z]{2,24}(\b|\/))/iu;
export const hasNoLink = (value: string) => !LINK_LIKE.test(value);

export const nameSchema = z
  .string({ error: 'Enter your name' })
  .trim()
  .min(1, 'Enter your name')
  .max(120, 'Use at most 120 characters')
  .refine(hasNoLink, { error: 'A name cannot contain a web or e-mail address' });

/**
 * Where the app may send someone after a link: a path on Basted itself (one leading slash, no
 * scheme or host), so a crafted link cannot lead off the site.
 */
export const nextPathSchema = z
  .string()
  .max(300, 'Use at most 300 characters')
  .regex(/^\/(?![/\\])[^\s]*$/, 'must be a path on this site, such as /invitations/…');

/**
 * The new account's time zone, for reminders on the person's own mornings and times shown in it;
 * the sign-up form fills in the device's zone. Without one, UTC.
 */
export const signUpSchema = z.object({
  name: nameSchema,
  email: emailSchema,
  password: passwordSchema,
  timeZone: z
    .string({ error: 'Choose a time zone' })
    .trim()
    .refine(isTimeZone, 'Choose a time zone such as Europe/London or America/Chicago')
    .default('UTC'),
  next: nextPathSchema.optional(),
});
export type SignUpInput = z.input<typeof signUpSchema>;

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password' }).min(1, 'Enter your password').max(200),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const resetRequestSchema = z.object({ email: emailSchema });
export type ResetRequestInput = z.infer<typeof resetRequestSchema>;

export const resetConfirmSchema = z.object({
  token: z.string({ error: 'The reset link is incomplete' }).min(20, 'The reset link is incomplete').max(200),
  password: passwordSchema,
});
export type ResetConfirmInput = z.infer<typeof resetConfirmSchema>;

export const confirmAddressSchema = z.object({
  token: z.string({ error: 'The link is incomplete' }).min(20, 'The link is incomplete').max(200),
});
