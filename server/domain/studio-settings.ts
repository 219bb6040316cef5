import { z } from 'zod';

/**
 * Studio-wide thresholds with their defaults. Stored per studio as JSON; a key the studio never
 * set takes the default here, so adding a setting needs no migration.
 */
export const studioSettingsSchema = z.object({
  /** Suggest the fuller-belly variant when the waist exceeds the size's by more than this (mm). */
  fullerBellyMarginMm: z.number().min(0).max(200).default(25.4),
});
export type StudioSettings = z.output<typeof studioSettingsSchema>;

export function resolveStudioSettings(stored: unknown): StudioSettings {
  const parsed = studioSettingsSchema.safeParse(stored ?? {});
  return parsed.success ? parsed.data : studioSettingsSchema.parse({});
}
