import { z } from 'zod';
import { ALTERATION_KINDS, FIT_AREAS } from '../alterations';

const amountMm = z.number({ error: 'must be a length in millimetres' }).refine((v) => v !== 0, 'an alteration of zero changes nothing').refine((v) => Math.abs(v) <= 500, 'must be at most 50 cm either way');

export const alterationSchema = z
  .object({
    area: z.enum(FIT_AREAS, { error: 'Choose a body area' }),
    kind: z.enum(ALTERATION_KINDS.map((k) => k.key) as [string, ...string[]], { error: 'Choose a kind of alteration' }),
    /** Signed: positive adds (lengthen, let out), negative removes (shorten, take in). */
    amountMm,
    where: z.enum(['front', 'back', 'both'], { error: 'Choose front, back or both' }),
    note: z.string().trim().max(1000).default(''),
    /** For kind "other": what was done, in the tester's words (a coordinator can map it later). */
    otherText: z.string().trim().max(300).default(''),
  })
  .superRefine((a, ctx) => {
    if (a.kind === 'other' && !a.otherText) ctx.addIssue({ code: 'custom', path: ['otherText'], message: 'Describe the alteration' });
  });

export const fabricUsedSchema = z.object({
  kind: z.string().trim().max(120),
  fibre: z.string().trim().max(120),
  widthMm: z.number().min(300, 'A fabric is at least 30 cm wide').max(4000).nullable(),
  usedMm: z.number().positive('must be more than zero').max(50000).nullable(),
  stretchPct: z.number().min(0).max(200).nullable(),
  napped: z.boolean(),
});

/**
 * A report as the tester saves it while working: every part optional, each checked on its own.
 * Submitting checks that the required parts are there (reportCompleteSchema).
 */
export const reportDraftSchema = z
  .object({
    sizeSewn: z.string().trim().max(20),
    variantSewn: z.string().trim().max(80).nullable(),
    draftVersion: z.number().int().min(1).nullable(),
    fit: z.partialRecord(z.enum(FIT_AREAS), z.number().int().min(-2, 'use −2 to +2').max(2, 'use −2 to +2')),
    alterations: z.array(alterationSchema).max(40),
    fabric: fabricUsedSchema,
    unclearSteps: z.array(z.object({ step: z.string().trim().min(1, 'Name the step').max(20), problem: z.string().trim().min(3, 'Say what was unclear').max(1000) })).max(40),
    verdict: z.string().trim().max(3000),
    wouldMakeAgain: z.boolean().nullable(),
  })
  .partial();
export type ReportDraft = z.infer<typeof reportDraftSchema>;

export const reportCompleteSchema = z.object({
  sizeSewn: z.string({ error: 'Say which size you sewed' }).min(1, 'Say which size you sewed'),
  draftVersion: z.number({ error: 'Say which draft you sewed' }).int().min(1),
  fit: z.record(z.string(), z.number()).refine((f) => Object.keys(f).length > 0, 'Rate the fit of at least one area'),
  verdict: z.string({ error: 'Give your overall verdict' }).min(3, 'Give your overall verdict'),
});
