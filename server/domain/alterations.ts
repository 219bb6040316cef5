import type { GarmentCategory } from './garments';

/**
 * The alteration vocabulary: what a tester changed, by body area. Concepts follow the usual
 * fitting alterations of the trade (common practice; the list in the project's trade reference,
 * §3); the keys and wording are ours. Each kind names the body measurement it answers to, when one
 * does, so the analysis can compare an amount with the tester's own body delta.
 */
export type AlterationKind = {
  key: string;
  label: string;
  area: FitArea;
  /** Body measurement whose difference from the chart may explain the amount. */
  measurement: string | null;
  /** Garment families the kind applies to. */
  for: readonly Family[];
};

export type Family = 'bottoms' | 'tops' | 'all';
export const FIT_AREAS = ['waist', 'hip', 'seat', 'rise', 'thigh', 'leg', 'hem', 'bust', 'shoulder', 'back', 'chest', 'neck', 'arm', 'length'] as const;
export type FitArea = (typeof FIT_AREAS)[number];

export const ALTERATION_KINDS: readonly AlterationKind[] = [
  { key: 'leg-length', label: 'Leg length', area: 'leg', measurement: 'inseam', for: ['bottoms'] },
  { key: 'crotch-depth', label: 'Crotch depth', area: 'rise', measurement: 'crotch_depth_seated', for: ['bottoms'] },
  { key: 'front-rise', label: 'Front crotch length', area: 'rise', measurement: 'total_crotch_length', for: ['bottoms'] },
  { key: 'back-rise', label: 'Back crotch length', area: 'rise', measurement: 'total_crotch_length', for: ['bottoms'] },
  { key: 'crotch-curve-scoop', label: 'Scoop the crotch curve', area: 'rise', measurement: null, for: ['bottoms'] },
  { key: 'full-seat', label: 'Full or flat seat', area: 'seat', measurement: 'hip', for: ['bottoms'] },
  { key: 'full-tummy', label: 'Full tummy', area: 'waist', measurement: 'waist', for: ['bottoms', 'tops'] },
  { key: 'swayback', label: 'Swayback', area: 'back', measurement: null, for: ['all'] },
  { key: 'waist', label: 'Waist larger or smaller', area: 'waist', measurement: 'waist', for: ['all'] },
  { key: 'high-hip', label: 'High hip', area: 'hip', measurement: 'high_hip', for: ['all'] },
  { key: 'hip', label: 'Hip larger or smaller', area: 'hip', measurement: 'hip', for: ['all'] },
  { key: 'thigh', label: 'Thigh width', area: 'thigh', measurement: 'thigh', for: ['bottoms'] },
  { key: 'knee-calf', label: 'Knee or calf width', area: 'leg', measurement: 'calf', for: ['bottoms'] },
  { key: 'hem-length', label: 'Hem length', area: 'hem', measurement: null, for: ['all'] },
  { key: 'bust', label: 'Full or small bust', area: 'bust', measurement: 'bust', for: ['tops'] },
  { key: 'bust-point', label: 'Raise or lower the bust point', area: 'bust', measurement: null, for: ['tops'] },
  { key: 'shoulder-width', label: 'Broad or narrow shoulder', area: 'shoulder', measurement: 'shoulder_width', for: ['tops'] },
  { key: 'forward-shoulder', label: 'Forward shoulder', area: 'shoulder', measurement: null, for: ['tops'] },
  { key: 'shoulder-slope', label: 'Square or sloping shoulder', area: 'shoulder', measurement: null, for: ['tops'] },
  { key: 'back-width', label: 'Broad or narrow back', area: 'back', measurement: null, for: ['tops'] },
  { key: 'round-back', label: 'Round or erect back', area: 'back', measurement: 'back_waist_length', for: ['tops'] },
  { key: 'chest-width', label: 'Broad or narrow chest', area: 'chest', measurement: null, for: ['tops'] },
  { key: 'bodice-length', label: 'Bodice length', area: 'length', measurement: 'back_waist_length', for: ['tops'] },
  { key: 'neckline-gape', label: 'Neckline gape', area: 'neck', measurement: null, for: ['tops'] },
  { key: 'upper-arm', label: 'Upper arm width', area: 'arm', measurement: 'upper_arm', for: ['tops'] },
  { key: 'sleeve-length', label: 'Sleeve length', area: 'arm', measurement: null, for: ['tops'] },
  { key: 'other', label: 'Other (describe it)', area: 'length', measurement: null, for: ['all'] },
];

const FAMILY: Record<GarmentCategory, Family[]> = {
  trousers: ['bottoms'],
  shorts: ['bottoms'],
  skirt: ['bottoms'],
  dress: ['tops', 'bottoms'],
  top: ['tops'],
  shirt: ['tops'],
  jacket: ['tops'],
  coat: ['tops'],
  jumpsuit: ['tops', 'bottoms'],
  'childrens-wear': ['tops', 'bottoms'],
  sleepwear: ['tops', 'bottoms'],
  other: ['tops', 'bottoms'],
};

/** The garment families (tops, bottoms) a category belongs to. */
export function garmentFamilies(category: GarmentCategory): readonly Family[] {
  return FAMILY[category] ?? ['tops', 'bottoms'];
}

/** The kinds a tester may choose for a garment; skirts drop the kinds that need a crotch seam. */
export function alterationKindsFor(category: GarmentCategory): AlterationKind[] {
  const families = FAMILY[category];
  return ALTERATION_KINDS.filter(
    (k) => k.for.includes('all') || k.for.some((f) => families.includes(f)),
  ).filter((k) => category !== 'skirt' || (k.area !== 'rise' && k.key !== 'thigh' && k.key !== 'leg-length' && k.key !== 'knee-calf'));
}

/** The areas a tester rates from −2 (too tight or short) to +2 (too loose or long). */
export function fitAreasFor(category: GarmentCategory): FitArea[] {
  return [...new Set(alterationKindsFor(category).filter((k) => k.key !== 'other').map((k) => k.area))];
}

export const FIT_SCALE = [
  { value: -2, label: 'Much too tight or short' },
  { value: -1, label: 'A little tight or short' },
  { value: 0, label: 'Right' },
  { value: 1, label: 'A little loose or long' },
  { value: 2, label: 'Much too loose or long' },
] as const;
