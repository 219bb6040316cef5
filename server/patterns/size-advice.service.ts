import { Studio, TesterProfile, type Pattern, type User } from '../../db/models';
import type { FabricKind, GarmentCategory } from '../domain/garments';
import type { MeasurementKey } from '../domain/measurements';
import { adviseSize, type SizeAdvice } from '../domain/size-advice';
import { resolveStudioSettings } from '../domain/studio-settings';
import type { LengthUnit } from '../domain/units';

type Body = Partial<Record<MeasurementKey, number>>;

/** Size advice for a body against a stored pattern, with the studio's own thresholds. */
export async function adviceFor(
  pattern: Pattern,
  body: Body,
  unit: LengthUnit,
): Promise<SizeAdvice> {
  const studio = await Studio.findByPk(pattern.studioId);
  const settings = resolveStudioSettings(studio?.settings);
  return adviseSize({
    category: pattern.category as GarmentCategory,
    fabricKind: pattern.fabricKind as FabricKind,
    chart: {
      sizes: (pattern.sizes ?? []).map((s) => ({ id: s.id, label: s.label, bodyMm: s.bodyMm as Body })),
      draftedHeightMm: pattern.draftedHeightMm,
      variants: (pattern.variants ?? []).map((v) => ({
        id: v.id,
        name: v.name,
        kind: v.kind as 'fuller-belly' | 'cup' | 'other',
        overrides: v.valuesMm as Record<string, Body>,
      })),
    },
    body,
    settings: { fullerBellyMarginMm: settings.fullerBellyMarginMm },
    unit,
  });
}

/** The caller's own advice, from their saved profile. */
export async function myAdvice(pattern: Pattern, user: User) {
  const profile = await TesterProfile.findByPk(user.id);
  const measurementsMm = (profile?.measurementsMm ?? {}) as Body;
  return { measurementsMm, advice: await adviceFor(pattern, measurementsMm, user.lengthUnit) };
}
