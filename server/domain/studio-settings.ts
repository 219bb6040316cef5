import { z } from 'zod';
import { DEFAULT_THRESHOLDS, type Thresholds } from '../analysis/thresholds';

const share = (what: string) => z.number({ error: `must be ${what} between 0 and 1` }).min(0, 'must be at least 0').max(1, 'must be at most 1');
const count = (min: number, max: number) => z.number({ error: 'must be a whole number' }).int('must be a whole number').min(min, `must be at least ${min}`).max(max, `must be at most ${max}`);

/**
 * The analysis thresholds a studio may change (server/analysis/thresholds.ts holds every default).
 * Each is optional: a threshold the studio never set follows the default.
 */
const ANALYSIS_SHAPE = {
    alpha: z.number({ error: 'must be a significance level such as 0.05' }).gt(0, 'must be above 0').max(0.2, 'must be at most 0.2'),
    minTestersPerDraft: count(2, 50),
    minMakers: count(2, 50),
    gradingMinMakerSizes: count(2, 20),
    personalFitMinAbsR: share('a correlation'),
    personalFitMinPairs: count(3, 100),
    draftWideMinLowerBound: share('a rate'),
    draftWideMinDirectionShare: share('a share'),
    sizeSpecificMinCount: count(1, 50),
    compareMinTesters: count(2, 50),
    fitFlagMinAbsMean: z.number({ error: 'must be a rating between 0 and 2' }).min(0).max(2, 'must be at most 2'),
    fitAreaMinAbsMean: z.number({ error: 'must be a rating between 0 and 2' }).min(0).max(2, 'must be at most 2'),
    fabricShortShare: share('a share'),
    fabricMinOver: count(1, 50),
    unclearStepMinTesters: count(1, 50),
};
export const analysisSettingsSchema = z.object(ANALYSIS_SHAPE).partial();
export type AnalysisSettings = z.output<typeof analysisSettingsSchema>;
export const ANALYSIS_SETTING_KEYS = Object.keys(ANALYSIS_SHAPE) as (keyof AnalysisSettings)[];

type Patch<T extends Record<string, z.ZodType>> = { [K in keyof T]: z.ZodOptional<z.ZodNullable<T[K]>> };
/** A change to the thresholds: a number sets one, null puts it back to its default. */
export const analysisSettingsPatchSchema = z.strictObject(
  Object.fromEntries(Object.entries(ANALYSIS_SHAPE).map(([k, v]) => [k, v.nullable().optional()])) as Patch<typeof ANALYSIS_SHAPE>,
  { error: (issue) => (issue.code === 'unrecognized_keys' ? `${issue.keys.join(', ')}: not a threshold of the findings` : undefined) },
);

/** Applies a change of thresholds to the stored ones. */
export function mergeAnalysisSettings(stored: unknown, patch: z.output<typeof analysisSettingsPatchSchema>): AnalysisSettings {
  const next: Record<string, number> = { ...resolveStudioSettings(stored).analysis };
  for (const [key, value] of Object.entries(patch)) {
    if (value === null) delete next[key];
    else if (value !== undefined) next[key] = value;
  }
  return next;
}

/**
 * How long testers' photos stay after a release unless the studio says otherwise: a year lets the
 * designer use allowed photos around the launch, and no photo is kept for ever by default.
 */
export const DEFAULT_PHOTO_RETENTION_DAYS = 365;

/**
 * Studio-wide thresholds with their defaults. Stored per studio as JSON; a key the studio never
 * set takes the default here, so adding a setting needs no migration.
 */
export const studioSettingsSchema = z.object({
  /** Suggest the fuller-belly variant when the waist exceeds the size's by more than this (mm). */
  fullerBellyMarginMm: z.number().min(0).max(200).default(25.4),
  /** The findings' thresholds the studio changed; the rest follow DEFAULT_THRESHOLDS. */
  analysis: analysisSettingsSchema.default({}),
  /** Where testers' answers to the studio's messages go (Reply-To); mail itself comes from Basted. */
  contactEmail: z.string().nullable().default(null),
  /** Days testers' photos are kept after a trial is released; null keeps them until removed by hand. */
  photoRetentionDays: z.number().int().min(0).max(3650).nullable().default(DEFAULT_PHOTO_RETENTION_DAYS),
});
export type StudioSettings = z.output<typeof studioSettingsSchema>;

export function resolveStudioSettings(stored: unknown): StudioSettings {
  const parsed = studioSettingsSchema.safeParse(stored ?? {});
  return parsed.success ? parsed.data : studioSettingsSchema.parse({});
}

/** The thresholds a studio's findings use: its own where set, the defaults elsewhere. */
export function studioThresholds(stored: unknown): Thresholds {
  return { ...DEFAULT_THRESHOLDS, ...resolveStudioSettings(stored).analysis };
}
