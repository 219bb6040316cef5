import { z } from 'zod';
import { emailSchema } from './auth';
import { CHECKLIST_KEYS } from '../release';

/** The studio's choices before a release: the final draft and the note that accepts a coverage gap. */
export const releaseSettingsSchema = z
  .object({
    finalDraftId: z.uuid({ error: 'Choose one of the pattern’s drafts' }).nullable(),
    coverageGapNote: z.string({ error: 'Write the note as text' }).trim().max(2000, 'Keep the note under 2000 characters').nullable(),
  })
  .partial();
export type ReleaseSettingsInput = z.input<typeof releaseSettingsSchema>;

/** Releasing: every checklist item that does not hold must be named here, as a confirmation. */
export const releaseSchema = z.object({
  confirmOpenItems: z.array(z.enum(CHECKLIST_KEYS, { error: 'is not an item of the checklist' })).max(CHECKLIST_KEYS.length).default([]),
});

export const excuseSchema = z.object({
  excused: z.boolean({ error: 'Say whether the tester is excused' }),
  note: z.string().trim().max(500, 'Keep the note under 500 characters').nullable().default(null),
});

/** A CSV of reward codes (one a line, an optional "code" header), sent as text. */
export const rewardCodesSchema = z.object({
  csv: z.string({ error: 'Choose a CSV file of codes' }).min(1, 'The file is empty').max(200_000, 'The file is too large: at most 200 000 characters'),
});

export const ANNOUNCEMENT_STATUSES = ['active', 'finished', 'dropped'] as const;
export const ANNOUNCEMENT_STATUS_LABELS: Record<(typeof ANNOUNCEMENT_STATUSES)[number], string> = {
  active: 'Still sewing',
  finished: 'Finished',
  dropped: 'Left the trial',
};

export const announcementSchema = z.object({
  subject: z.string({ error: 'Write a subject' }).trim().min(3, 'Use at least 3 characters').max(200, 'Use at most 200 characters'),
  body: z.string({ error: 'Write the message' }).trim().min(1, 'Write the message').max(10_000, 'Keep the message under 10 000 characters'),
  statuses: z.array(z.enum(ANNOUNCEMENT_STATUSES, { error: 'Choose still sewing, finished or left' })).min(1, 'Choose at least one group of testers'),
  /** Only testers of these sizes; empty means every size. */
  sizeIds: z.array(z.uuid({ error: 'is not a size of the pattern' })).max(60).default([]),
});
export type AnnouncementInput = z.input<typeof announcementSchema>;

export const copyTrialSchema = z.object({
  title: z.string({ error: 'Enter a title' }).trim().min(3, 'Use at least 3 characters').max(160, 'Use at most 160 characters'),
  /** Every date of the trial moves by this many days. */
  shiftDays: z.number({ error: 'must be a number of days' }).int('must be a whole number of days').min(-3650, 'must be within ten years').max(3650, 'must be within ten years'),
  inviteFinishers: z.boolean().default(false),
});
export type CopyTrialInput = z.input<typeof copyTrialSchema>;

export const POOL_HEIGHT_BANDS = [
  { id: 'under-160', label: 'Under 160 cm (5 ft 3 in)', minMm: null, maxMm: 1600 },
  { id: '160-170', label: '160–170 cm (5 ft 3 in – 5 ft 7 in)', minMm: 1600, maxMm: 1700 },
  { id: '170-180', label: '170–180 cm (5 ft 7 in – 5 ft 11 in)', minMm: 1700, maxMm: 1800 },
  { id: '180-up', label: '180 cm (5 ft 11 in) and over', minMm: 1800, maxMm: null },
] as const;
export type PoolBandId = (typeof POOL_HEIGHT_BANDS)[number]['id'];

export function poolBandOf(heightMm: number | null | undefined): PoolBandId | null {
  if (typeof heightMm !== 'number') return null;
  return POOL_HEIGHT_BANDS.find((b) => (b.minMm === null || heightMm >= b.minMm) && (b.maxMm === null || heightMm < b.maxMm))!.id;
}

export const poolQuerySchema = z.object({
  size: z.string().trim().max(40).optional(),
  band: z.enum(POOL_HEIGHT_BANDS.map((b) => b.id) as [PoolBandId, ...PoolBandId[]], { error: 'Choose one of the height bands' }).optional(),
  variant: z.string().trim().max(120).optional(),
  minFinished: z.coerce.number({ error: 'must be a whole number' }).int('must be a whole number').min(0).max(100).optional(),
  /** Only people who sent every report on time. */
  onTime: z.enum(['true', 'false']).optional(),
});
export type PoolQuery = z.output<typeof poolQuerySchema>;

export const poolInviteSchema = z.object({
  trialId: z.uuid({ error: 'Choose the call to invite to' }),
  userIds: z.array(z.uuid({ error: 'is not a person of the pool' })).min(1, 'Choose at least one person').max(300, 'Invite at most 300 people at once'),
});

export const deleteAccountSchema = z.object({
  password: z.string({ error: 'Enter your password' }).min(1, 'Enter your password').max(200),
  confirm: z.literal('delete', { error: 'Type delete to confirm' }),
});
export type DeleteAccountInput = z.input<typeof deleteAccountSchema>;

/** The studio's contact address and photo keeping period, as the settings form holds them. */
export const contactSettingsFormSchema = z
  .object({
    contactEmail: z.union([z.literal(''), emailSchema]),
    keepPhotos: z.enum(['days', 'always'], { error: 'Choose how long photos are kept' }),
    photoRetentionDays: z.string().trim(),
  })
  .superRefine((v, ctx) => {
    if (v.keepPhotos !== 'days') return;
    const days = Number(v.photoRetentionDays);
    if (!/^\d+$/.test(v.photoRetentionDays) || !Number.isInteger(days)) ctx.addIssue({ code: 'custom', path: ['photoRetentionDays'], message: 'Enter a whole number of days' });
    else if (days > 3650) ctx.addIssue({ code: 'custom', path: ['photoRetentionDays'], message: 'At most 3650 days (ten years)' });
  });
export type ContactSettingsForm = z.input<typeof contactSettingsFormSchema>;
