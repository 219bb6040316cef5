/**
 * Safety cautions for patterns (issue 4 part 6; DESIGN.md "Safety and care"): for children's wear
 * and sleepwear, the usual cautions about cords and drawstrings, small parts and flammability with
 * the standard named, each ending with a note to follow the rules where the garment is sold; and for
 * every pattern, heat, steam and blade care notes for its instructions.
 *
 * The wording is ours. The facts come from ../shared/reference/trade-facts.md §7 and carry its
 * markers in `basis`: 'source' where trade-facts read the source (ASTM F1816-18 via ANSI and a UL
 * summary; 16 CFR 1120 via TÜV SÜD; EN 14682 via Tukes; 16 CFR 1501 via eCFR and a TTL summary),
 * 'memory' where it is marked [MEM] (its line "Flammability: 16 CFR 1610; sleepwear 1615/1616 [MEM]"
 * carries one marker for the whole line, so both flammability rules are treated as from memory and
 * the text asks the reader to check the current rule). The care notes are common practice [CP].
 *
 * These are reminders, not legal advice: the rules differ by country and change, and the text says so.
 *
 * Pure on purpose: no Node imports (the pattern and instructions screens show these).
 */
import type { GarmentCategory } from './garments';

export type CautionTopic = 'cords-and-drawstrings' | 'small-parts' | 'flammability' | 'heat' | 'steam' | 'blades';

export type StandardRef = {
  /** As the standard is cited, e.g. "ASTM F1816-18". */
  code: string;
  /** What it covers, in our words (not the standard's official title). */
  about: string;
  /** source: trade-facts read it (or a summary of it); memory: from memory there, unverified. */
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
  about: 'US rule: children’s upper outerwear that breaks the drawstring rules is a substantial product hazard',
  basis: 'source',
};
const EN_14682: StandardRef = {
  code: 'EN 14682',
  about: 'cords and drawstrings on children’s clothing (Europe)',
  basis: 'source',
};
const CFR_1501: StandardRef = {
  code: '16 CFR 1501',
  about: 'US small-parts test for articles meant for children under three',
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
    'ASTM F1816-18 (US): no hood or neck drawstrings on upper outerwear in children’s sizes 2T to 12. Waist and bottom drawstrings in sizes 2T to 16 may stick out at most 3 in (75 mm) outside the channel when the garment is laid out fully expanded, must have no toggles or knots at the free ends, and, if they are one continuous cord, must be bar-tacked so they cannot be pulled out. In the US, garments that break these rules are treated as a substantial product hazard (16 CFR 1120).',
    'EN 14682 (Europe): no cords or drawstrings at the hood or neck for children up to age 7 (up to 134 cm tall); for ages 7 to 14, no free ends there.',
    LOCAL_RULES_NOTE,
  ],
  standards: [F1816, CFR_1120, EN_14682],
};

const SMALL_PARTS: Caution = {
  id: 'children-small-parts',
  kind: 'safety',
  topic: 'small-parts',
  title: 'Small parts on clothes for babies and toddlers',
  paragraphs: [
    'Buttons, snaps, beads, bows, pompoms and other trims can come off and choke a child under three. Sew them on firmly, prefer flat or covered fastenings, and leave loose decorations off garments for the youngest sizes.',
    '16 CFR 1501 (US): for articles meant for children under three, any part that fits inside the test cylinder, 1.25 in (about 32 mm) wide and 1.00 to 2.25 in (about 25 to 57 mm) deep, fails; this covers buttons and trims.',
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

/**
 * The cautions to show with a pattern of this category: the safety cautions that apply (children's
 * wear: cords and drawstrings, small parts, flammability; sleepwear: flammability, with a pointer to
 * the children's cautions), then the care notes every pattern's instructions carry.
 */
export function cautionsFor(category: GarmentCategory): Caution[] {
  const safety: Caution[] =
    category === 'childrens-wear'
      ? [DRAWSTRINGS, SMALL_PARTS, FLAMMABILITY_CHILDREN]
      : category === 'sleepwear'
        ? [FLAMMABILITY_SLEEPWEAR]
        : [];
  return [...safety, ...CARE_NOTES];
}
