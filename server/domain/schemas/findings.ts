import { z } from 'zod';
import { ALTERATION_KINDS } from '../alterations';

const findingKey = {
  /** A kind of the vocabulary, or "other: …" with the tester's words. */
  kind: z.string({ error: 'Name the kind of alteration' }).trim().min(1, 'Name the kind of alteration').max(320),
  direction: z.enum(['add', 'remove'], { error: 'Choose add or remove' }),
};

export const TRIAGE_STATES = ['open', 'will-fix', 'personal-fit', 'fixed'] as const;

export const triageSchema = z
  .object({
    ...findingKey,
    state: z.enum(TRIAGE_STATES, { error: 'Choose open, will fix, personal fit or fixed' }),
    fixedInDraft: z.number({ error: 'must be a draft number' }).int('must be a draft number').min(1, 'must be a draft number').max(100_000, 'must be a draft number').nullable().optional(),
  })
  .superRefine((t, ctx) => {
    if (t.state === 'fixed' && t.fixedInDraft == null) ctx.addIssue({ code: 'custom', path: ['fixedInDraft'], message: 'Say which draft fixed it' });
  });

export const findingNoteSchema = z.object({
  ...findingKey,
  body: z.string({ error: 'Write the note' }).trim().min(1, 'Write the note').max(4000, 'Keep the note under 4000 characters'),
});

const mappable = ALTERATION_KINDS.filter((k) => k.key !== 'other').map((k) => k.key) as [string, ...string[]];
export const otherMappingSchema = z.object({
  text: z.string({ error: 'Give the words of the alteration' }).trim().min(1, 'Give the words of the alteration').max(300),
  /** A kind of the vocabulary; null forgets the mapping. */
  kind: z.enum(mappable, { error: 'Choose a kind of alteration' }).nullable(),
});

/** "Took in  the Back waist" and "took in the back waist" are the same words. */
export function otherTextKey(text: string): string {
  return text.trim().toLowerCase().replace(/\s+/g, ' ');
}
