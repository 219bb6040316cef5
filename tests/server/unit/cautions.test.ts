// Safety cautions. The standards and their limits are checked against trade-facts §7 with its
// markers: ASTM F1816-18 [SRC: ANSI; UL summary], 16 CFR 1120 [SRC: TÜV SÜD], EN 14682 [SRC: Tukes],
// 16 CFR 1501 [SRC: eCFR; TTL summary], flammability 16 CFR 1610 and 1615/1616 [MEM].
import { cautionsFor, LOCAL_RULES_NOTE, type Caution } from '../../../server/domain/cautions';
import { GARMENT_CATEGORY_KEYS } from '../../../server/domain/garments';

const codes = (cs: Caution[]) => cs.flatMap((c) => c.standards.map((s) => s.code));
const text = (c: Caution | undefined) => (c?.paragraphs ?? []).join(' ');

describe("children's wear", () => {
  const cautions = cautionsFor('childrens-wear');
  const drawstrings = cautions.find((c) => c.topic === 'cords-and-drawstrings');

  it('has the drawstring caution naming ASTM F1816-18 and its limits (ASTM F1816-18, trade-facts §7 [SRC])', () => {
    expect(drawstrings).toBeDefined();
    expect(codes([drawstrings as Caution])).toEqual(expect.arrayContaining(['ASTM F1816-18', '16 CFR 1120', 'EN 14682']));
    // no hood or neck drawstrings in sizes 2T–12; waist and bottom at most 3 in (75 mm), 2T–16;
    // no toggles or knots
    expect(text(drawstrings)).toContain('no hood or neck drawstrings on upper outerwear in children’s sizes 2T to 12');
    expect(text(drawstrings)).toContain('sizes 2T to 16 may stick out at most 3 in (75 mm) outside the channel');
    expect(text(drawstrings)).toContain('no toggles or knots');
  });

  it('names EN 14682 for hood and neck cords up to age 7 / 134 cm (EN 14682, trade-facts §7 [SRC: Tukes])', () => {
    expect(text(drawstrings)).toContain('up to age 7 (up to 134 cm tall)');
  });

  it('has the small-parts caution for under-3s with the 16 CFR 1501 cylinder (trade-facts §7 [SRC: eCFR])', () => {
    const small = cautions.find((c) => c.topic === 'small-parts');
    expect(codes([small as Caution])).toEqual(['16 CFR 1501']);
    expect(text(small)).toContain('1.25 in (about 32 mm) wide and 1.00 to 2.25 in');
    expect(text(small)).toContain('under three');
  });

  it('has the flammability caution, its rules marked as from memory (trade-facts §7 [MEM])', () => {
    const fire = cautions.find((c) => c.topic === 'flammability');
    expect(fire?.standards.map((s) => [s.code, s.basis])).toEqual([
      ['16 CFR 1610', 'memory'],
      ['16 CFR 1615 and 1616', 'memory'],
    ]);
    expect(text(fire)).toContain('check the current rules');
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

  it.each(GARMENT_CATEGORY_KEYS.map((k) => [k]))('%s: every pattern carries the heat, steam and blade care notes [CP]', (category) => {
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
