// Safety cautions. The standards and their limits are checked against tests/reference/SOURCES.md §7,
// with the basis kept there: ASTM F1816-18 (ANSI listing; UL summary), 16 CFR 1120 and the edition
// it incorporates, ASTM F1816-97 (CPSC guidance; 2011 final rule; the section number 1120.3 from
// memory), EN 14682 (Tukes), 16 CFR 1501 and its exemption 1501.3(d) (CFR text), flammability
// 16 CFR 1610 and 1615/1616 (from memory). When the children's cautions apply: §7.2 (our rule,
// common practice).
import { cautionsFor, childrensWearSignals, LOCAL_RULES_NOTE, type Caution, type PatternForCautions } from '../../../server/domain/cautions';
import { GARMENT_CATEGORY_KEYS } from '../../../server/domain/garments';

const codes = (cs: Caution[]) => cs.flatMap((c) => c.standards.map((s) => s.code));
const text = (c: Caution | undefined) => (c?.paragraphs ?? []).join(' ');
const topics = (p: PatternForCautions) => cautionsFor(p).filter((c) => c.kind === 'safety').map((c) => c.topic);
const labelled = (category: string, labels: string[], extra: Partial<PatternForCautions> = {}): PatternForCautions => ({
  category,
  sizes: labels.map((label) => ({ label })),
  ...extra,
});
const CHILDREN = ['cords-and-drawstrings', 'small-parts', 'flammability'];

describe("children's wear", () => {
  const cautions = cautionsFor('childrens-wear');
  const drawstrings = cautions.find((c) => c.topic === 'cords-and-drawstrings');
  const small = cautions.find((c) => c.topic === 'small-parts');

  it('has the drawstring caution naming ASTM F1816-18 and its limits (ASTM F1816-18, SOURCES.md §7.1)', () => {
    expect(drawstrings).toBeDefined();
    expect(codes([drawstrings as Caution])).toEqual(expect.arrayContaining(['ASTM F1816-18', '16 CFR 1120', 'EN 14682']));
    // no hood or neck drawstrings in sizes 2T–12; waist and bottom at most 3 in (75 mm), 2T–16;
    // no toggles or knots
    expect(text(drawstrings)).toContain('no hood or neck drawstrings on upper outerwear in children’s sizes 2T to 12');
    expect(text(drawstrings)).toContain('sizes 2T to 16 may stick out at most 3 in (75 mm) outside the channel');
    expect(text(drawstrings)).toContain('no toggles or knots');
  });

  it('names the edition the US rule incorporates, ASTM F1816-97, as 16 CFR 1120 cites it (CPSC guidance, SOURCES.md §7.1)', () => {
    expect(codes([drawstrings as Caution])).toContain('ASTM F1816-97');
    expect(text(drawstrings)).toContain('16 CFR 1120 treats children’s upper outerwear whose drawstrings do not meet ASTM F1816-97');
    // the section number was not read: said to be from memory
    expect(text(drawstrings)).toContain('1120.3, is cited from memory');
  });

  it('names EN 14682 for hood and neck cords up to age 7 / 134 cm (EN 14682, SOURCES.md §7.1, Tukes)', () => {
    expect(text(drawstrings)).toContain('up to age 7 (up to 134 cm tall)');
  });

  it('has the small-parts caution for under-3s with the 16 CFR 1501 cylinder (CFR text, SOURCES.md §7.1)', () => {
    expect(codes([small as Caution])).toEqual(['16 CFR 1501']);
    expect(text(small)).toContain('1.25 in (about 32 mm) wide and 1.00 to 2.25 in');
    expect(text(small)).toContain('under three');
  });

  it('does not say the small-parts rule covers buttons and trims on clothing: 1501.3 exempts children’s clothing and accessories such as buttons', () => {
    expect(text(small)).not.toMatch(/this covers buttons and trims/);
    expect(text(small)).not.toMatch(/rule (covers|applies to) (buttons|clothing)/);
    expect(text(small)).toContain('Children’s clothing and accessories such as buttons are among the articles that rule exempts (16 CFR 1501.3)');
    expect(small?.standards[0].about).toContain('exempt (1501.3)');
    // the practical advice stays, marked as common practice
    expect(text(small)).toContain('Common practice for the youngest sizes: sew them on firmly');
  });

  it('has the flammability caution, its rules marked as from memory (SOURCES.md §7.1)', () => {
    const fire = cautions.find((c) => c.topic === 'flammability');
    expect(fire?.standards.map((s) => [s.code, s.basis])).toEqual([
      ['16 CFR 1610', 'memory'],
      ['16 CFR 1615 and 1616', 'memory'],
    ]);
    expect(text(fire)).toContain('check the current rules');
  });
});

describe("when the children's cautions apply (SOURCES.md §7.2)", () => {
  it('a children’s hoodie filed as a top or a jacket gets them when the pattern is marked as made for children', () => {
    for (const category of ['top', 'jacket']) {
      expect(topics({ category })).toEqual([]);
      expect(topics({ category, childrensWear: true })).toEqual(CHILDREN);
      expect(childrensWearSignals({ category, childrensWear: true })).toEqual(['the pattern is marked as made for children']);
    }
  });

  it.each([
    [['2T', '3T', '4T', '5', '6'], '2T, 3T, 4T'],
    [['0-3M', '3-6M', '6-12 mo', '18 months'], '0-3M, 3-6M, 6-12 mo, 18 months'],
    [['NB', 'S', 'M'], 'NB'],
    // more than four are shortened to the first three and the last
    [['4Y', '5Y', '7-8 yrs', 'age 9', '10 years'], '4Y, 5Y, 7-8 yrs … 10 years'],
    [['104 cm', '110cm', '152 cm'], '104 cm, 110cm'],
    // every label a children's height in the 6 cm steps, one at least 68; 152 is not under 150 cm
    [['86', '92', '98', '152'], '86, 92, 98'],
  ])('a jacket with sizes %j gets them, naming the sizes', (labels, named) => {
    const p = labelled('jacket', labels);
    expect(topics(p)).toEqual(CHILDREN);
    expect(childrensWearSignals(p)).toEqual([`the size chart has children’s sizes (${named})`]);
  });

  it.each([
    [['XS', 'S', 'M', 'L', 'XL']],
    // misses' and European adult numbers; plus sizes 1X–6X; teen heights over 150 cm
    [['2', '4', '6', '8', '10', '12', '14', '16']],
    [['32', '34', '36', '38', '40', '42', '44']],
    [['44', '46', '48', '50', '52', '54', '56', '58', '60', '62']],
    [['1X', '2X', '3X', '4X', '5X', '6X']],
    [['152', '158', '164', '170', '176']],
    // a bra-band chart with one number in the height steps
    [['65', '70', '75', '80', '85']],
  ])('adult labels %j give no children’s caution', (labels) => {
    expect(topics(labelled('jacket', labels))).toEqual([]);
    expect(childrensWearSignals(labelled('jacket', labels))).toEqual([]);
  });

  it('a chart giving a body height under 150 cm, or drafted for one, gets them (named in the reader’s unit)', () => {
    const chart: PatternForCautions = { category: 'top', sizes: [{ label: 'S', bodyMm: { height: 1040 } }, { label: 'M', bodyMm: { height: 1600 } }] };
    expect(topics(chart)).toEqual(CHILDREN);
    // by hand: 1500 mm / 25.4 = 59.06 in → 59 in to the 1/8 in
    expect(childrensWearSignals(chart, 'in')).toEqual(['the chart gives a height under 59 in for size S']);
    expect(childrensWearSignals(chart, 'cm')).toEqual(['the chart gives a height under 150 cm for size S']);
    expect(childrensWearSignals({ category: 'top', draftedHeightMm: 1220 })).toEqual(['it is drafted for a height of 122 cm']);
    // an adult chart: 150 cm and above give nothing
    expect(topics({ category: 'top', draftedHeightMm: 1500, sizes: [{ label: 'XS', bodyMm: { height: 1500 } }] })).toEqual([]);
  });

  it('children’s sleepwear gets the children’s cautions, not the adult sleepwear one', () => {
    expect(topics(labelled('sleepwear', ['2T', '3T']))).toEqual(CHILDREN);
    expect(topics(labelled('sleepwear', ['S', 'M']))).toEqual(['flammability']);
  });
});

describe('other categories', () => {
  it('trousers have no drawstring caution and no safety caution at all', () => {
    const cautions = cautionsFor('trousers');
    expect(cautions.find((c) => c.topic === 'cords-and-drawstrings')).toBeUndefined();
    expect(cautions.filter((c) => c.kind === 'safety')).toEqual([]);
  });

  it('sleepwear has the flammability caution and points to the children’s cautions, without repeating the drawstring rules', () => {
    const cautions = cautionsFor('sleepwear');
    expect(cautions.filter((c) => c.kind === 'safety').map((c) => c.topic)).toEqual(['flammability']);
    expect(codes(cautions)).toEqual(expect.arrayContaining(['16 CFR 1610', '16 CFR 1615 and 1616']));
    expect(text(cautions[0])).toContain('cords and drawstrings and about small parts apply to it too');
  });

  it.each(GARMENT_CATEGORY_KEYS.map((k) => [k]))('%s: every pattern carries the heat, steam and blade care notes (common practice)', (category) => {
    const care = cautionsFor(category).filter((c) => c.kind === 'care');
    expect(care.map((c) => c.topic)).toEqual(['heat', 'steam', 'blades']);
  });

  it.each([['childrens-wear'], ['sleepwear']] as const)('%s: every safety caution ends with the note to follow local rules', (category) => {
    const safety = cautionsFor(category).filter((x) => x.kind === 'safety');
    expect(safety.length).toBeGreaterThan(0);
    for (const c of safety) {
      expect(c.paragraphs[c.paragraphs.length - 1]).toBe(LOCAL_RULES_NOTE);
      expect(c.standards.length).toBeGreaterThan(0);
    }
  });
});
