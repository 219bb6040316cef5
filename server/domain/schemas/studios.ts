import { z } from 'zod';
import { INVITABLE_ROLES, ROLES } from '../roles';
import { analysisSettingsPatchSchema } from '../studio-settings';
import { isTimeZone } from '../time-zones';
import { emailSchema, hasNoLink } from './auth';

export const timeZoneSchema = z
  .string({ error: 'Choose a time zone' })
  .refine(isTimeZone, 'Choose a time zone from the list, such as Europe/Lisbon or America/Chicago');

export const createStudioSchema = z.object({
  name: z
    .string({ error: 'Enter the studio name' })
    .trim()
    .min(2, 'Use at least 2 characters')
    .max(120, 'Use at most 120 characters')
    // The name is quoted in the invitations the studio sends.
    .refine(hasNoLink, { error: 'A studio name cannot contain a web or e-mail address' }),
  timeZone: timeZoneSchema.default('UTC'),
});
export type CreateStudioInput = z.input<typeof createStudioSchema>;

export const updateStudioSchema = z.object({
  name: createStudioSchema.shape.name.optional(),
  timeZone: timeZoneSchema.optional(),
  settings: z
    .object({
      fullerBellyMarginMm: z.number({ error: 'must be a length in millimetres' }).min(0, 'must not be negative').max(200, 'must be at most 20 cm'),
      /** Thresholds of the findings; null puts one back to its default. */
      analysis: analysisSettingsPatchSchema,
      /** The studio's own address for replies to its messages; null removes it. */
      contactEmail: emailSchema.nullable(),
      /** Days photos are kept after a release; null keeps them until removed by hand. */
      photoRetentionDays: z
        .number({ error: 'must be a number of days' })
        .int('must be a whole number of days')
        .min(0, 'must not be negative')
        .max(3650, 'must be at most 3650 days (ten years)')
        .nullable(),
    })
    .partial()
    .optional(),
});

export const inviteSchema = z.object({
  email: emailSchema,
  role: z.enum(INVITABLE_ROLES, { error: 'Choose coordinator, grader or tester' }),
});
export type InviteInput = z.infer<typeof inviteSchema>;

export const changeRoleSchema = z.object({
  role: z.enum(ROLES, { error: 'Choose owner, coordinator, grader or tester' }),
});

export const currentStudioSchema = z.object({ studioId: z.uuid({ error: 'Choose one of your studios' }) });
