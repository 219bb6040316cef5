import { z } from 'zod';
import { EXPERIENCE_LEVELS } from './profile';
import { MILESTONE_KINDS, TESTER_MILESTONES, TRIAL_STATES } from '../trials';

/**
 * A date and time with its offset, within years 2000–2199: a trial's dates are near today, and a
 * year such as 0000 (which PostgreSQL has no place for) is a typing slip, refused by name.
 */
const isoTime = z.iso
  .datetime({ offset: true, error: 'must be a date and time, e.g. 2027-03-01T18:00:00+00:00' })
  .refine((v) => {
    const year = new Date(v).getUTCFullYear();
    return year >= 2000 && year < 2200;
  }, 'must be a date between the years 2000 and 2199');

export const coverageSchema = z.object({
  sizes: z
    .array(z.object({ sizeId: z.uuid({ error: 'is not a size of the pattern' }), target: z.number().int('Use a whole number').min(1, 'At least 1 tester').max(30, 'At most 30 testers') }))
    .max(60),
  heightBands: z
    .array(
      z.object({
        id: z.string().min(1).max(40),
        label: z.string().trim().min(1, 'Name the band').max(40),
        minMm: z.number().min(500).max(2500).nullable(),
        maxMm: z.number().min(500).max(2500).nullable(),
      }),
    )
    .max(6),
  variants: z.array(z.uuid({ error: 'is not a variant of the pattern' })).max(20),
});

const trialFields = {
  title: z.string({ error: 'Enter a title' }).trim().min(3, 'Use at least 3 characters').max(160, 'Use at most 160 characters'),
  callText: z.string().max(20000, 'Use at most 20000 characters'),
  requirements: z.string().max(5000, 'Use at most 5000 characters'),
  coverage: coverageSchema,
  milestones: z.partialRecord(z.enum(MILESTONE_KINDS), isoTime),
};

export const createTrialSchema = z.object({
  patternId: z.uuid({ error: 'Choose one of the studio’s patterns' }),
  ...trialFields,
  callText: trialFields.callText.default(''),
  requirements: trialFields.requirements.default(''),
  coverage: coverageSchema.default({ sizes: [], heightBands: [], variants: [] }),
  milestones: trialFields.milestones.default({}),
});
export type CreateTrialInput = z.input<typeof createTrialSchema>;

export const updateTrialSchema = z
  .object({ ...trialFields, state: z.enum(TRIAL_STATES, { error: 'Choose draft, open, running or closed' }) })
  .partial();

export const PHOTO_CONSENTS = ['staff-only', 'may-share'] as const;

export const applySchema = z.object({
  sizeId: z.uuid({ error: 'Choose one of the pattern’s sizes' }).nullable(),
  variantId: z.uuid({ error: 'Choose one of the pattern’s variants' }).nullable().default(null),
  plannedFabric: z.string({ error: 'Say what fabric you plan to use' }).trim().min(3, 'Say what fabric you plan to use').max(500),
  experience: z.enum(EXPERIENCE_LEVELS, { error: 'Choose your sewing experience' }),
  deadlinesConfirmed: z.literal(true, { error: 'Please confirm you can meet the deadlines' }),
  photoConsent: z.enum(PHOTO_CONSENTS, { error: 'Choose who may see your photos' }),
  note: z.string().trim().max(2000).nullable().default(null),
});
export type ApplyInput = z.input<typeof applySchema>;

export const decideSchema = z.object({
  applicationIds: z.array(z.uuid()).min(1, 'Choose at least one applicant').max(300),
  status: z.enum(['applied', 'shortlisted', 'selected', 'waitlisted', 'declined'], { error: 'Choose a decision' }),
});

export const dueOverrideSchema = z.object({
  kind: z.enum(TESTER_MILESTONES as unknown as [string, ...string[]], { error: 'Only the check-in and the final report have per-tester dates' }),
  dueAt: isoTime.nullable(),
});
