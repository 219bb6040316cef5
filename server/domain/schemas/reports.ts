import { z } from 'zod';
import { ALTERATION_KINDS, FIT_AREAS } from '../alterations';

const amountMm = z.number({ error: 'must be a length in millimetres' }).refine((v) => v !== 0, 'an alteration of zero changes nothing').refine((v) => Math.abs(v) <= 500, 'must be at most 50 cm either way');
const KIND_KEYS = ALTERATION_KINDS.map((k) => k.key) as [string, ...string[]];

/**
 * One alteration as the tester enters it. Every answer starts empty (null) and stays so until the
 * tester gives it: nothing is filled in for them. A row counts (in the findings, the CSV, the
 * staff's view) only once its kind and amount are given (see countedAlterations); submitting asks
 * for the missing answers of every row that is not blank.
 */
export const alterationSchema = z.object({
  area: z.enum(FIT_AREAS, { error: 'Choose a body area' }).nullable().default(null),
  kind: z.enum(KIND_KEYS, { error: 'Choose a kind of alteration' }).nullable().default(null),
  /** Signed: positive adds (lengthen, let out), negative removes (shorten, take in). */
  amountMm: amountMm.nullable().default(null),
  where: z.enum(['front', 'back', 'both'], { error: 'Choose front, back or both' }).nullable().default(null),
  note: z.string().trim().max(1000).default(''),
  /** For kind "other": what was done, in the tester's words (a coordinator can map it later). */
  otherText: z.string().trim().max(300).default(''),
});
export type AlterationEntry = z.output<typeof alterationSchema>;
/** An alteration with the answers that make it count. */
export type CountedAlteration = AlterationEntry & { kind: string; amountMm: number };

/** A row the tester added and left without a single answer. */
export function isBlankAlteration(a: AlterationEntry): boolean {
  return a.area === null && a.kind === null && a.amountMm === null && a.where === null && !a.note && !a.otherText;
}

/** What a row still needs before it counts, keyed by its field (empty when it counts). */
export function missingInAlteration(a: AlterationEntry): Partial<Record<'kind' | 'amountMm' | 'otherText', string>> {
  const missing: Partial<Record<'kind' | 'amountMm' | 'otherText', string>> = {};
  if (a.kind === null) missing.kind = 'Choose what you changed';
  if (a.amountMm === null) missing.amountMm = 'Give the amount you changed';
  if (a.kind === 'other' && !a.otherText) missing.otherText = 'Describe the alteration';
  return missing;
}

/** The alterations of a report that count: kind and amount given (and words for "other"). */
export function countedAlterations(content: { alterations?: AlterationEntry[] }): CountedAlteration[] {
  return (content.alterations ?? []).filter((a): a is CountedAlteration => Object.keys(missingInAlteration(a)).length === 0);
}

/** The unclear steps that count: a step named and the problem said. */
export function countedUnclearSteps(content: { unclearSteps?: { step: string; problem: string }[] }) {
  return (content.unclearSteps ?? []).filter((s) => s.step.trim() !== '' && s.problem.trim().length >= 3);
}

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
    unclearSteps: z.array(z.object({ step: z.string().trim().max(20), problem: z.string().trim().max(1000) })).max(40),
    verdict: z.string().trim().max(3000),
    wouldMakeAgain: z.boolean().nullable(),
  })
  .partial();
export type ReportDraft = z.infer<typeof reportDraftSchema>;
export type ReportPart = keyof ReportDraft;

/**
 * A save: the parts that changed, and the version of the report they were made on. The server
 * applies them only to that version; a save made on an older one is answered 409 with the report
 * as it now is, so the sender can put its changes on top and send again.
 */
export const reportSaveSchema = z.object({
  baseVersion: z.number({ error: 'Send the version of the report these changes were made on' }).int().min(0),
  changes: reportDraftSchema,
});
export type ReportSave = z.input<typeof reportSaveSchema>;

/** Submitting: the version the tester saw, so a report changed elsewhere meanwhile is not sent unseen. */
export const reportSubmitSchema = z.object({ version: z.number().int().min(0).optional() });

export const reportCompleteSchema = z
  .object({
    sizeSewn: z.string({ error: 'Say which size you sewed' }).min(1, 'Say which size you sewed'),
    draftVersion: z.number({ error: 'Say which draft you sewed' }).int().min(1),
    fit: z.record(z.string(), z.number()).refine((f) => Object.keys(f).length > 0, 'Rate the fit of at least one area'),
    verdict: z.string({ error: 'Give your overall verdict' }).min(3, 'Give your overall verdict'),
    alterations: z.array(alterationSchema).optional(),
    unclearSteps: z.array(z.object({ step: z.string(), problem: z.string() })).optional(),
  })
  .superRefine((r, ctx) => {
    (r.alterations ?? []).forEach((a, i) => {
      if (isBlankAlteration(a)) return;
      for (const [field, message] of Object.entries(missingInAlteration(a))) ctx.addIssue({ code: 'custom', path: ['alterations', i, field], message });
    });
    (r.unclearSteps ?? []).forEach((s, i) => {
      if (!s.step.trim() && !s.problem.trim()) return;
      if (!s.step.trim()) ctx.addIssue({ code: 'custom', path: ['unclearSteps', i, 'step'], message: 'Name the step' });
      if (s.problem.trim().length < 3) ctx.addIssue({ code: 'custom', path: ['unclearSteps', i, 'problem'], message: 'Say what was unclear' });
    });
  });
