import { z } from 'zod';
import { measurementsSchema } from '../measurements';
import { FABRIC_UNITS, LENGTH_UNITS } from '../units';
import { nameSchema } from './auth';
import { timeZoneSchema } from './studios';

export const EXPERIENCE_LEVELS = ['beginner', 'confident', 'advanced', 'professional'] as const;
export type Experience = (typeof EXPERIENCE_LEVELS)[number];
export const EXPERIENCE_LABELS: Record<Experience, string> = {
  beginner: 'Beginner: a few garments sewn',
  confident: 'Confident: sews from patterns regularly',
  advanced: 'Advanced: alters and fits patterns',
  professional: 'Professional: sews or fits for a living',
};

/**
 * The profile form and PATCH /api/me/profile: every part optional, so the form can save as the
 * person goes. Measurements are millimetres; a null clears one; the object sent replaces the
 * stored one.
 */
export const profileSchema = z
  .object({
    name: nameSchema,
    lengthUnit: z.enum(LENGTH_UNITS, { error: 'Choose inches or centimetres' }),
    fabricUnit: z.enum(FABRIC_UNITS, { error: 'Choose yards or metres' }),
    timeZone: timeZoneSchema,
    experience: z.enum(EXPERIENCE_LEVELS, { error: 'Choose one of the listed levels' }).nullable(),
    fitNotes: z.string().trim().max(1000, 'Use at most 1000 characters').nullable(),
    measurementsMm: measurementsSchema,
    // Only optional mail appears here: account and security mail cannot be turned off.
    mail: z
      .object({ reminders: z.boolean(), trialNews: z.boolean(), digest: z.boolean() })
      .partial(),
  })
  .partial();
export type ProfileInput = z.input<typeof profileSchema>;
