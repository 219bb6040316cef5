/**
 * Safety cautions for patterns: for children's wear and sleepwear, the usual cautions about cords
 * and drawstrings, small parts and flammability with the standard named, each ending with a note to
 * follow the rules where the garment is sold; and for every pattern, heat, steam and blade care
 * notes for its instructions.
 *
 * Children's cautions follow the pattern, not only its garment category: a children's hoodie filed
 * as a top or a jacket gets them when the designer marks the pattern as made for children, or when
 * its size chart shows children's sizes (see childrensWearSignals for the rule).
 *
 * The wording is ours. Each fact's source is in tests/reference/SOURCES.md §7 and its basis is kept
 * in `basis`: 'source' where a source was read (ASTM F1816-18 via its ANSI listing and a UL summary;
 * 16 CFR 1120 and its incorporated edition ASTM F1816-97 via the CPSC's guidance and the 2011 final
 * rule; EN 14682 via Tukes; 16 CFR 1501 and its exemption of children's clothing, 1501.3(d), via
 * the CFR text), 'memory' where it is from memory (both flammability rules; the section number
 * 1120.3). The care notes are common practice.
 *
 * These are reminders, not legal advice: the rules differ by country and change, and the text says so.
 *
 * Pure on purpose: no Node imports (the pattern and instructions screens show these).
 */
import type { GarmentCategory } from './garments';
import { formatLength, type LengthUnit } from './units';

export type CautionTopic = 'cords-and-drawstrings' | 'small-parts' | 'flammability' | 'heat' | 'steam' | 'blades';

export type StandardRef = {
  /** As the standard is cited, e.g. "ASTM F1816-18". */
  code: string;
  /** What it covers, in our words (not the standard's official title). */
  about: string;
  /** source: the text or a summary of it was read (tests/reference/SOURCES.md §7); memory: from memory, unverified. */
  basis: 'source' | 'memory';
};

export type Caution = {
  id: string;
  /** safety: about the garment and who wears it; care: about making it (for the instructions). */
  kind: 'safety' | 'care';
  topic: CautionTopic;
  title: string;
  /** Plain-English paragraphs; a safety caution's last one is always the local-rules note. */
  paragraphs: string[];
  standards: StandardRef[];
};

/** The closing note of every safety caution. */
export const LOCAL_RULES_NOTE =
  'Rules differ from country to country and change over time: follow the rules that apply where the garment will be sold or worn, and check the current text of the standards named here.';

const F1816: StandardRef = {
  code: 'ASTM F1816-18',
  about: 'drawstrings on children’s upper outerwear',
  basis: 'source',
};
const CFR_1120: StandardRef = {
  code: '16 CFR 1120',
  about: 'US rule: children’s upper outerwear whose drawstrings do not meet ASTM F1816-97 is a substantial product hazard',
  basis: 'source',
};
const F1816_97: StandardRef = {
  code: 'ASTM F1816-97',
  about: 'the edition of the drawstring standard that 16 CFR 1120 incorporates',
  basis: 'source',
};
const EN_14682: StandardRef = {
  code: 'EN 14682',
  about: 'cords and drawstrings on children’s clothing (Europe)',
  basis: 'source',
};
const CFR_1501: StandardRef = {
  code: '16 CFR 1501',
  about: 'US small-parts test for toys and other articles meant for children under three; children’s clothing and accessories such as buttons are exempt (1501.3)',
  basis: 'source',
};
const CFR_1610: StandardRef = {
  code: '16 CFR 1610',
  about: 'US flammability of clothing textiles',
  basis: 'memory',
};
const CFR_1615_1616: StandardRef = {
  code: '16 CFR 1615 and 1616',
  // The size split (0–6X, 7–14) is from memory too.
  about: 'US flammability of children’s sleepwear (sizes 0–6X and 7–14)',
  basis: 'memory',
};

const DRAWSTRINGS: Caution = {
  id: 'children-cords-drawstrings',
  kind: 'safety',
  topic: 'cords-and-drawstrings',
  title: 'Cords and drawstrings on children’s clothes',
  paragraphs: [
    'Cords at the hood or neck can catch on play equipment, car and bus doors and cots, and strangle a child. Leave them off: use snaps, hook-and-loop tape, elastic or a fixed tab instead.',
    'ASTM F1816-18 (US): no hood or neck drawstrings on upper outerwear in children’s sizes 2T to 12. Waist and bottom drawstrings in sizes 2T to 16 may stick out at most 3 in (75 mm) outside the channel when the garment is laid out fully expanded, must have no toggles or knots at the free ends, and, if they are one continuous cord, must be bar-tacked so they cannot be pulled out.',
    'The US rule 16 CFR 1120 treats children’s upper outerwear whose drawstrings do not meet ASTM F1816-97, the edition of the standard it incorporates, as a substantial product hazard (the section, 1120.3, is cited from memory). The limits above are the same in that edition.',
    'EN 14682 (Europe): no cords or drawstrings at the hood or neck for children up to age 7 (up to 134 cm tall); for ages 7 to 14, no free ends there.',
    LOCAL_RULES_NOTE,
  ],
  standards: [F1816, CFR_1120, F1816_97, EN_14682],
};

const SMALL_PARTS: Caution = {
  id: 'children-small-parts',
  kind: 'safety',
  topic: 'small-parts',
  title: 'Small parts on clothes for babies and toddlers',
  paragraphs: [
    'Buttons, snaps, beads, bows, pompoms and other trims can come off and choke a child under three. Common practice for the youngest sizes: sew them on firmly and check them after washing, prefer flat or covered fastenings, and leave loose decorations off.',
    '16 CFR 1501 (US) is the small-parts test for toys and other articles meant for children under three: a part that fits inside its test cylinder, 1.25 in (about 32 mm) wide and 1.00 to 2.25 in (about 25 to 57 mm) deep, fails. Children’s clothing and accessories such as buttons are among the articles that rule exempts (16 CFR 1501.3), so for a garment the cylinder is a guide to what a small child could swallow, not a test the garment must pass; other rules for children’s products may still apply.',
    LOCAL_RULES_NOTE,
  ],
  standards: [CFR_1501],
};

const FLAMMABILITY_CHILDREN: Caution = {
  id: 'children-flammability',
  kind: 'safety',
  topic: 'flammability',
  title: 'Flammability of children’s clothes and sleepwear',
  paragraphs: [
    'Some fabrics catch fire and burn fast, especially brushed or napped ones with a raised surface. Recommend fabrics that meet the clothing flammability rules, and for children’s pyjamas and nightwear either flame-resistant fabric or a close, tight fit as the rules allow.',
    'In the US, clothing textiles fall under 16 CFR 1610, and children’s sleepwear under 16 CFR 1615 and 1616 (both named from memory here: check the current rules).',
    LOCAL_RULES_NOTE,
  ],
  standards: [CFR_1610, CFR_1615_1616],
};

const FLAMMABILITY_SLEEPWEAR: Caution = {
  id: 'sleepwear-flammability',
  kind: 'safety',
  topic: 'flammability',
  title: 'Flammability of sleepwear',
  paragraphs: [
    'Nightwear is worn near heaters, candles and stoves, and loose, flowing shapes in brushed or napped fabric catch fire most easily. Recommend fabrics that meet the clothing flammability rules.',
    'In the US, clothing textiles fall under 16 CFR 1610. Sleepwear in children’s sizes has its own stricter rules, 16 CFR 1615 and 1616: flame-resistant fabric, or a close, tight fit as the rules allow (both named from memory here: check the current rules).',
    'If the pattern comes in children’s sizes, the cautions about cords and drawstrings and about small parts apply to it too.',
    LOCAL_RULES_NOTE,
  ],
  standards: [CFR_1610, CFR_1615_1616],
};

/** Care notes for every pattern's instructions [CP]. */
export const CARE_NOTES: readonly Caution[] = [
  {
    id: 'care-heat',
    kind: 'care',
    topic: 'heat',
    title: 'Pressing and heat',
    paragraphs: [
      'An iron is hot enough to burn skin and to melt synthetic fabric, fusible interfacing and some trims. Test the heat on a scrap first, use a press cloth, keep the cord clear of your feet, and stand the iron up or switch it off whenever you step away.',
    ],
    standards: [],
  },
  {
    id: 'care-steam',
    kind: 'care',
    topic: 'steam',
    title: 'Steam',
    paragraphs: [
      'Steam scalds faster than a hot plate burns. Keep fingers out of the steam when shaping with the iron, use a pressing ham or a tool rather than your hand, and let the iron cool before you fill or empty it.',
    ],
    standards: [],
  },
  {
    id: 'care-blades',
    kind: 'care',
    topic: 'blades',
    title: 'Blades, pins and needles',
    paragraphs: [
      'Close the guard on a rotary cutter every time you put it down, cut away from yourself with your other hand clear of the blade, and change a dull blade rather than pressing harder. Keep shears, blades, pins and needles out of children’s reach, and keep count of pins so none end up in a garment.',
    ],
    standards: [],
  },
];

// ---------------------------------------------------------------------------------------------
// When the children's cautions apply

/** What is known of a pattern when choosing its cautions; only the category is required. */
export type PatternForCautions = {
  category: GarmentCategory | string;
  /** The designer's own word that it is made for children. */
  childrensWear?: boolean | null;
  draftedHeightMm?: number | null;
  sizes?: readonly { label: string; bodyMm?: Partial<Record<string, number | null>> }[];
};

/**
 * Below this body height a size is a child's (tests/reference/SOURCES.md §7.2). Adult size charts rarely list a height under 150 cm
 * (short adult ranges are commonly drafted for about 152–160 cm), while the US children's sizes up
 * to 12 stay under it; common practice, not a standard. EN 14682 counts children up to 14 years
 * (176 cm), so a chart of older children's sizes needs the designer's flag.
 */
export const CHILD_HEIGHT_BELOW_MM = 1500;

/**
 * Children's size designations in the labels people use [common practice]: toddler sizes ("2T" …
 * "6T"), months ("0-3M", "6 mo", "18 months"), newborn ("NB", "preemie") and ages ("4Y",
 * "7-8 yrs", "age 6", "10 years"). Bare numbers ("2" … "16") are not read as children's sizes:
 * misses' charts use the same numbers.
 */
const CHILD_LABEL = [
  /^[1-6]\s?t$/i,
  /^\d{1,2}(\s*(-|–|to|\/)\s*\d{1,2})?\s*(m|mo|mos|mth|mths|months?)$/i,
  /^(nb|newborn|preemie|prem)$/i,
  /^(age\s*)?\d{1,2}(\s*(-|–|to|\/)\s*\d{1,2})?\s*(y|yr|yrs|years?)$/i,
  /^age\s*\d{1,2}(\s*(-|–|to)\s*\d{1,2})?$/i,
];

/**
 * Children's sizes designated by body height in cm, in the 6 cm steps of the European children's
 * charts (50, 56 … 176; the steps are common practice). Read as heights only when EVERY label of
 * the chart is such a number and one is at least 68, larger than any adult numeric size, so adult
 * charts (European 32–62) are never taken for children's; a label with "cm" is read on its own.
 */
const HEIGHT_SERIES = new Set(Array.from({ length: 22 }, (_, i) => 50 + 6 * i));

function heightOfLabelCm(label: string): number | null {
  const m = /^(\d{2,3})\s*cm$/i.exec(label.trim());
  return m ? Number(m[1]) : null;
}

/**
 * Why a pattern gets the children's cautions, in words (empty when it does not). The rule, any one
 * of: the garment category is children's wear; the designer marked it as made for children; a size
 * label is a children's designation (toddler, months, newborn, age, or a height under 150 cm); the
 * labels are all children's heights in cm (see HEIGHT_SERIES); the chart gives a body height
 * under 150 cm for some size; or the chart is drafted for a height under 150 cm.
 */
export function childrensWearSignals(pattern: PatternForCautions, unit: LengthUnit = 'cm'): string[] {
  const reasons: string[] = [];
  if (pattern.category === 'childrens-wear') reasons.push('the garment is children’s wear');
  if (pattern.childrensWear) reasons.push('the pattern is marked as made for children');
  const sizes = pattern.sizes ?? [];
  const labels = sizes.map((s) => s.label.trim());
  const byLabel = labels.filter((l) => CHILD_LABEL.some((re) => re.test(l)) || (heightOfLabelCm(l) ?? Infinity) * 10 < CHILD_HEIGHT_BELOW_MM);
  const numbers = labels.map((l) => (/^\d{2,3}$/.test(l) ? Number(l) : NaN));
  const allHeights = labels.length > 0 && numbers.every((n) => HEIGHT_SERIES.has(n)) && numbers.some((n) => n >= 68 && n * 10 < CHILD_HEIGHT_BELOW_MM);
  const childLabels = allHeights ? labels.filter((_, i) => numbers[i] * 10 < CHILD_HEIGHT_BELOW_MM) : byLabel;
  if (childLabels.length) reasons.push(`the size chart has children’s sizes (${listed(childLabels)})`);
  const short = sizes.filter((s) => typeof s.bodyMm?.height === 'number' && s.bodyMm.height < CHILD_HEIGHT_BELOW_MM);
  if (short.length) {
    reasons.push(`the chart gives a height under ${height(CHILD_HEIGHT_BELOW_MM, unit)} for ${short.length === 1 ? 'size' : 'sizes'} ${listed(short.map((s) => s.label))}`);
  }
  if (pattern.draftedHeightMm != null && pattern.draftedHeightMm < CHILD_HEIGHT_BELOW_MM) {
    reasons.push(`it is drafted for a height of ${height(pattern.draftedHeightMm, unit)}`);
  }
  return reasons;
}

/** A height in whole centimetres ("150 cm") or to the 1/8 in ("59 in"). */
function height(mm: number, unit: LengthUnit): string {
  return unit === 'cm' ? `${Math.round(mm / 10)} cm` : formatLength(mm, 'in');
}

function listed(items: string[]): string {
  return items.length <= 4 ? items.join(', ') : `${items.slice(0, 3).join(', ')} … ${items[items.length - 1]}`;
}

/**
 * The cautions to show with a pattern: the safety cautions that apply (made for children, by any
 * of the signals above: cords and drawstrings, small parts, flammability; sleepwear for adults:
 * flammability, with a pointer to the children's cautions), then the care notes every pattern's
 * instructions carry. A bare category is read as a pattern with nothing else known.
 */
export function cautionsFor(pattern: PatternForCautions | GarmentCategory): Caution[] {
  const p = typeof pattern === 'string' ? { category: pattern } : pattern;
  const safety: Caution[] =
    childrensWearSignals(p).length > 0
      ? [DRAWSTRINGS, SMALL_PARTS, FLAMMABILITY_CHILDREN]
      : p.category === 'sleepwear'
        ? [FLAMMABILITY_SLEEPWEAR]
        : [];
  return [...safety, ...CARE_NOTES];
}
