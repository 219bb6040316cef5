// Coverage grid and automatic selection of testers (server/domain/coverage.ts). The example cases
// are invented and small enough to check by hand; the arithmetic is shown beside each value. The
// properties are the guarantees (issue 5 part 7) over random trials, with fast-check.
// Trade facts used here are common practice [CP] (tests/reference/SOURCES.md §7.4): 2–3
// testers per size, over-recruit about 20–30 % for drop-outs. fast-check is imported as a namespace,
// as in units.test.ts: the default import draws a lint warning on every call.
import * as fc from 'fast-check';
import {
  bandOf,
  bestWaitlisted,
  COMMON_OVER_RECRUIT_RATE,
  COMMON_TESTERS_PER_SIZE,
  coverageGrid,
  DEFAULT_HEIGHT_BANDS,
  describeBand,
  describeReliability,
  heightBandProblems,
  NEUTRAL_PRIOR,
  proposeSelection,
  reliabilityScore,
  studioReliabilityPrior,
  type Applicant,
  type ApplicationStatus,
  type CoverageTargets,
  type HeightBand,
  type SelectionProposal,
} from '../../../server/domain/coverage';

const cm = (x: number) => x * 10;

let serial = 0;
/** An applicant with plain defaults: applied, no variant, a regular height, no history. */
function applicant(over: Partial<Applicant> & { id: string }): Applicant {
  serial += 1;
  return {
    appliedAt: `2025-03-01T09:${String(serial % 60).padStart(2, '0')}:00Z`,
    status: 'applied',
    sizeId: null,
    variantId: null,
    heightMm: cm(165),
    reliability: { finishedOnTime: 0, enrolled: 0 },
    ...over,
  };
}

function record(finishedOnTime: number, enrolled: number) {
  return { finishedOnTime, enrolled };
}

function pickIds(p: SelectionProposal, kind?: 'kept' | 'new'): string[] {
  return p.picks.filter((x) => kind == null || x.kind === kind).map((x) => x.applicantId);
}

function leftOutOf(p: SelectionProposal, id: string) {
  const entry = p.leftOut.find((x) => x.applicantId === id);
  if (!entry) throw new Error(`${id} was not left out`);
  return entry;
}

// Three sizes at 2–3 testers each [CP]; the default bands petite < 160 cm ≤ regular < 172 cm ≤ tall.
const trousers: CoverageTargets = {
  sizes: [
    { id: 's10', label: '10', target: 2 },
    { id: 's12', label: '12', target: COMMON_TESTERS_PER_SIZE },
    { id: 's14', label: '14', target: 2 },
  ],
  heightBands: DEFAULT_HEIGHT_BANDS,
  variants: [],
};

describe('height bands', () => {
  it('puts a height in the band whose lower limit it reaches and whose upper limit it stays under', () => {
    expect(bandOf(cm(159.9), DEFAULT_HEIGHT_BANDS)?.id).toBe('petite');
    expect(bandOf(cm(160), DEFAULT_HEIGHT_BANDS)?.id).toBe('regular');
    expect(bandOf(cm(171.9), DEFAULT_HEIGHT_BANDS)?.id).toBe('regular');
    expect(bandOf(cm(172), DEFAULT_HEIGHT_BANDS)?.id).toBe('tall');
    expect(bandOf(cm(205), DEFAULT_HEIGHT_BANDS)?.id).toBe('tall');
  });

  it('gives no band to a missing height or one outside closed bands', () => {
    const closed: HeightBand[] = [{ id: 'mid', label: 'Mid', minMm: cm(150), maxMm: cm(180) }];
    expect(bandOf(null, DEFAULT_HEIGHT_BANDS)).toBeNull();
    expect(bandOf(cm(149), closed)).toBeNull();
    expect(bandOf(cm(180), closed)).toBeNull();
    expect(bandOf(cm(165), [])).toBeNull();
  });

  it('describes the limits in the viewer unit', () => {
    const [petite, regular, tall] = DEFAULT_HEIGHT_BANDS as [HeightBand, HeightBand, HeightBand];
    expect(describeBand(petite)).toBe('under 160.0 cm');
    expect(describeBand(regular)).toBe('160.0 cm up to 172.0 cm');
    // 1720 mm / 25.4 = 67.72 in → nearest 1/8: 67 6/8 = 67 3/4 in (by hand).
    expect(describeBand(tall, 'in')).toBe('67 3/4 in and over');
  });

  it('accepts the default bands and names a gap, an overlap and a band open in the middle', () => {
    expect(heightBandProblems(DEFAULT_HEIGHT_BANDS)).toEqual([]);
    const gap = heightBandProblems([
      { id: 'a', label: 'Short', minMm: null, maxMm: cm(158) },
      { id: 'b', label: 'Long', minMm: cm(160), maxMm: null },
    ]);
    expect(gap).toEqual(['Heights from 158.0 cm up to 160.0 cm fall in no band ("Short" ends before "Long" starts).']);
    const overlap = heightBandProblems([
      { id: 'a', label: 'Short', minMm: null, maxMm: cm(165) },
      { id: 'b', label: 'Long', minMm: cm(160), maxMm: null },
    ]);
    expect(overlap).toHaveLength(1);
    expect(overlap[0]).toMatch(/overlap/);
    const openMiddle = heightBandProblems([
      { id: 'a', label: 'Short', minMm: null, maxMm: null },
      { id: 'b', label: 'Long', minMm: null, maxMm: null },
    ]);
    expect(openMiddle).toEqual([
      'Only the last band may be open above; "Short" is.',
      'Only the first band may be open below; "Long" is.',
    ]);
  });
});

describe('reliability', () => {
  it('uses Laplace (k + 1) / (n + 2) when the studio has no history', () => {
    expect(studioReliabilityPrior([])).toEqual(NEUTRAL_PRIOR);
    expect(reliabilityScore(record(0, 0))).toBe(0.5);
    expect(reliabilityScore(record(4, 5))).toBeCloseTo(5 / 7, 12); // (4 + 1) / (5 + 2)
    expect(reliabilityScore(record(0, 1))).toBeCloseTo(1 / 3, 12); // (0 + 1) / (1 + 2)
  });

  it('shrinks towards the studio prior: a newcomer scores the studio average exactly', () => {
    // Pooled studio record: 8 + 4 = 12 finished of 10 + 5 = 15 enrolled → mean 0.8.
    const prior = studioReliabilityPrior([record(8, 10), record(4, 5)]);
    expect(prior.mean).toBeCloseTo(0.8, 12);
    expect(prior.strength).toBe(2);
    expect(reliabilityScore(record(0, 0), prior)).toBeCloseTo(0.8, 12);
    // (1 + 0.8 × 2) / (1 + 2) = 2.6 / 3: one good trial lifts a little, not to 1.
    expect(reliabilityScore(record(1, 1), prior)).toBeCloseTo(2.6 / 3, 12);
    // (0 + 1.6) / 3: one missed trial lowers a little, not to 0.
    expect(reliabilityScore(record(0, 1), prior)).toBeCloseTo(1.6 / 3, 12);
    // (4 + 1.6) / (5 + 2) = 0.8: a record at the studio rate keeps the studio rate.
    expect(reliabilityScore(record(4, 5), prior)).toBeCloseTo(0.8, 12);
  });

  it('cleans impossible counts instead of failing', () => {
    expect(reliabilityScore(record(7, 3))).toBe(reliabilityScore(record(3, 3)));
    expect(reliabilityScore(record(-2, -1))).toBe(0.5);
  });

  it('says the record in words', () => {
    expect(describeReliability(record(4, 5))).toBe('reliability 0.71 (4 of 5 past trials finished on time)');
    expect(describeReliability(record(1, 1))).toBe('reliability 0.67 (1 of 1 past trial finished on time)');
    expect(describeReliability(record(0, 0))).toMatch(/^reliability 0\.50 \(no past trials/);
  });

  it('property: a newcomer scores the prior mean, scores stay within 0..1, and each on-time finish raises the score', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0.1, max: 20, noNaN: true }),
        fc.integer({ min: 1, max: 50 }),
        fc.nat(),
        (mean, strength, enrolled, seed) => {
          const prior = { mean, strength };
          expect(reliabilityScore(record(0, 0), prior)).toBeCloseTo(mean, 12);
          const k = seed % enrolled; // 0 … enrolled − 1, so k + 1 is still possible
          const lower = reliabilityScore(record(k, enrolled), prior);
          const higher = reliabilityScore(record(k + 1, enrolled), prior);
          expect(higher).toBeGreaterThan(lower);
          expect(lower).toBeGreaterThanOrEqual(0);
          expect(higher).toBeLessThanOrEqual(1);
        },
      ),
    );
  });
});

describe('coverage grid', () => {
  const applicants: Applicant[] = [
    applicant({ id: 'a1', sizeId: 's10', heightMm: cm(155), status: 'selected' }),
    applicant({ id: 'a2', sizeId: 's10', heightMm: cm(158), status: 'shortlisted' }),
    applicant({ id: 'a3', sizeId: 's10', heightMm: cm(175), status: 'waitlisted' }),
    applicant({ id: 'a4', sizeId: 's10', heightMm: cm(176), status: 'withdrawn' }),
    applicant({ id: 'a5', sizeId: 's12', heightMm: null }),
    applicant({ id: 'a6', sizeId: 's14', heightMm: cm(180), status: 'selected' }),
    applicant({ id: 'a7', sizeId: 's14', heightMm: cm(181), status: 'selected' }),
    applicant({ id: 'a8', sizeId: null, heightMm: cm(170) }),
    applicant({ id: 'a9', sizeId: 's99', heightMm: cm(170), status: 'declined' }),
  ];
  const grid = coverageGrid(trousers, applicants);
  const row = (id: string) => grid.rows.find((r) => r.sizeId === id)!;

  it('has one row per size, in order, and a "height not given" column because a5 gave none', () => {
    expect(grid.rows.map((r) => r.label)).toEqual(['10', '12', '14']);
    expect(grid.bands.map((b) => b.id)).toEqual(['petite', 'regular', 'tall', null]);
    expect(grid.variants).toEqual([]);
  });

  it('counts active applicants and selected testers per size against the target', () => {
    // Size 10: a1, a2, a3 active (a4 withdrew); a1 selected; target 2 → 1 open.
    expect(row('s10')).toMatchObject({ applicants: 3, selected: 1, shortlisted: 1, waitlisted: 1, pending: 0 });
    expect(row('s10')).toMatchObject({ target: 2, remaining: 1, over: 0, fill: 0.5, state: 'short' });
    expect(row('s12')).toMatchObject({ applicants: 1, selected: 0, pending: 1, remaining: 3, state: 'empty' });
    expect(row('s14')).toMatchObject({ applicants: 2, selected: 2, remaining: 0, state: 'full' });
  });

  it('marks each band cell covered, open or without applicants', () => {
    expect(row('s10').bands.map((b) => [b.bandId, b.state, b.applicants, b.selected])).toEqual([
      ['petite', 'covered', 2, 1],
      ['regular', 'no-applicants', 0, 0],
      ['tall', 'open', 1, 0], // a3 waits; a4 withdrew and is not counted
      [null, 'no-applicants', 0, 0],
    ]);
    expect(row('s10').bands[2]!.applicantIds).toEqual(['a3']);
    expect(row('s12').bands[3]).toMatchObject({ bandId: null, state: 'open', applicantIds: ['a5'] });
  });

  it('names the gaps and sums a one-line summary for a phone row', () => {
    expect(row('s10').gaps).toEqual([
      '1 of 2 places still open.',
      'No applicants in the Regular band.',
      'No one selected yet in the Tall band (1 applicant).',
    ]);
    expect(row('s10').summary).toBe('1 of 2 selected · 3 applicants · not covered: Regular, Tall');
  });

  it('asks for a reserve of about a quarter more applicants [CP: over-recruit 20–30 %]', () => {
    expect(COMMON_OVER_RECRUIT_RATE).toBe(0.25);
    // Size 12: ceil(3 × 1.25) = ceil(3.75) = 4 wanted, 1 applied → 3 more.
    expect(row('s12')).toMatchObject({ applicantsWanted: 4, recruitMore: 3 });
    // Size 10: ceil(2 × 1.25) = 3 wanted, 3 applied.
    expect(row('s10')).toMatchObject({ applicantsWanted: 3, recruitMore: 0 });
    expect(row('s12').gaps).toContain('1 applicant: aim for 4 to allow for drop-outs (common practice: over-recruit 20–30 %).');
  });

  it('totals the columns and keeps applicants without a wanted size apart', () => {
    expect(grid.totals).toMatchObject({ applicants: 6, selected: 3, target: 7, remaining: 4, over: 0 });
    expect(grid.bandTotals.map((b) => [b.bandId, b.applicants])).toEqual([
      ['petite', 2],
      ['regular', 0],
      ['tall', 3],
      [null, 1],
    ]);
    // a8 applied without a size; a9's size is not wanted but a9 was declined, so is not counted.
    expect(grid.unplaced).toMatchObject({ applicants: 1, applicantIds: ['a8'] });
  });

  it('shows an over-filled size as over, never hides it', () => {
    const over = coverageGrid(trousers, [
      applicant({ id: 'x1', sizeId: 's10', status: 'selected' }),
      applicant({ id: 'x2', sizeId: 's10', status: 'selected' }),
      applicant({ id: 'x3', sizeId: 's10', status: 'selected' }),
    ]);
    expect(over.rows[0]).toMatchObject({ state: 'over', over: 1, remaining: 0 });
    expect(over.rows[0]!.gaps[0]).toBe('Over the target: 3 selected for 2 places.');
  });

  it('adds the variant axis under each band, with "No variant" only when someone sews without one', () => {
    const withVariants: CoverageTargets = { ...trousers, variants: [{ id: 'fb', name: 'fuller-belly front' }] };
    const g = coverageGrid(withVariants, [
      applicant({ id: 'v1', sizeId: 's12', variantId: 'fb', heightMm: cm(165), status: 'selected' }),
      applicant({ id: 'v2', sizeId: 's12', variantId: null, heightMm: cm(165) }),
    ]);
    expect(g.variants).toEqual([
      { id: null, label: 'No variant' },
      { id: 'fb', label: 'fuller-belly front' },
    ]);
    const regular = g.rows[1]!.bands.find((b) => b.bandId === 'regular')!;
    expect(regular.variants.map((v) => [v.variantId, v.state])).toEqual([
      [null, 'open'],
      ['fb', 'covered'],
    ]);
    expect(g.rows[1]!.gaps).toContain('No one selected yet for the pattern without a variant (1 applicant).');
  });
});

describe('proposed selection, by hand', () => {
  it('covers a new height band before a more reliable tester in a band already covered', () => {
    // Size 12 (3 places [CP]): r1, r2, r3 regular, t1 tall. First pick: everyone would open a band;
    // r1 is the most reliable. Second: t1, the only one to open a band now, though the least
    // reliable. Third: r2 (4 of 5) before r3 (a newcomer).
    const prior = NEUTRAL_PRIOR;
    const p = proposeSelection(
      trousers,
      [
        applicant({ id: 'r1', sizeId: 's12', heightMm: cm(165), reliability: record(5, 5) }),
        applicant({ id: 'r2', sizeId: 's12', heightMm: cm(168), reliability: record(4, 5) }),
        applicant({ id: 't1', sizeId: 's12', heightMm: cm(178), reliability: record(0, 2) }),
        applicant({ id: 'r3', sizeId: 's12', heightMm: cm(166), reliability: record(0, 0) }),
      ],
      { prior },
    );
    expect(pickIds(p, 'new')).toEqual(['r1', 't1', 'r2']);
    expect(p.picks.map((x) => x.order)).toEqual([1, 2, 3]);
    // Reliability of r1 = (5 + 1) / (5 + 2) = 0.857; of r2 = (4 + 1) / 7 = 0.714; of t1 = 1 / 4 = 0.25.
    expect(p.picks[0]!.reason).toBe(
      'Picked: size 12 had 0 of 3 testers and no one yet in the Regular band; reliability 0.86 (5 of 5 past trials finished on time); more reliable than the next in line (0.86 against 0.71).',
    );
    expect(p.picks[1]!.reason).toBe(
      'Picked: size 12 had 1 of 3 testers and no one yet in the Tall band; reliability 0.25 (0 of 2 past trials finished on time); chosen before the others in this size to cover that band.',
    );
    // r3 scores 0.5 (a newcomer at the prior mean) against r2's 0.714.
    expect(leftOutOf(p, 'r3')).toMatchObject({
      cause: 'size-full',
      waitlistRank: 1,
      reason:
        'Left out: size 12 is full (3 of 3); the last place went to a more reliable applicant (0.71 against 0.50); this applicant: reliability 0.50 (no past trials with the studio: scored at the studio average). Waitlist suggestion 1 for size 12, Regular band.',
    });
  });

  it('fills the emptiest size first, by share of its target still open', () => {
    // Size 10 has 1 of 2 (half open); size 12 has 0 of 3 (all open); size 14 has 1 of 2.
    // One new pick allowed: it goes to size 12. The rest wait with a waitlist rank per cell.
    const p = proposeSelection(
      trousers,
      [
        applicant({ id: 'k10', sizeId: 's10', status: 'selected' }),
        applicant({ id: 'k14', sizeId: 's14', status: 'selected' }),
        applicant({ id: 'c10', sizeId: 's10', reliability: record(9, 9) }),
        applicant({ id: 'c12', sizeId: 's12', reliability: record(0, 3) }),
        applicant({ id: 'c14', sizeId: 's14' }),
      ],
      { maxNewPicks: 1 },
    );
    expect(pickIds(p, 'kept')).toEqual(['k10', 'k14']);
    expect(pickIds(p, 'new')).toEqual(['c12']);
    expect(leftOutOf(p, 'c10')).toMatchObject({ cause: 'limit-reached', waitlistRank: 1 });
    expect(leftOutOf(p, 'c10').reason).toBe(
      'Left out: the proposal stopped at 1 new pick; size 10 still has 1 open place. Waitlist suggestion 1 for size 10, Regular band.',
    );
  });

  it('keeps already-selected testers and leaves the rest of a full size out', () => {
    const p = proposeSelection(trousers, [
      applicant({ id: 'k1', sizeId: 's10', status: 'selected' }),
      applicant({ id: 'k2', sizeId: 's10', status: 'selected' }),
      applicant({ id: 'w1', sizeId: 's10', heightMm: cm(180) }),
    ]);
    expect(p.picks.map((x) => [x.applicantId, x.kind, x.reason])).toEqual([
      ['k1', 'kept', 'Kept: already selected for size 10.'],
      ['k2', 'kept', 'Kept: already selected for size 10.'],
    ]);
    expect(leftOutOf(p, 'w1')).toMatchObject({ cause: 'size-already-full', waitlistRank: 1 });
    expect(leftOutOf(p, 'w1').reason).toMatch(/^Left out: size 10 was already full \(2 of 2 selected before this proposal\)\./);
  });

  it('says why the withdrawn, the declined and those without a wanted size are left out', () => {
    const p = proposeSelection(trousers, [
      applicant({ id: 'gone', sizeId: 's10', status: 'withdrawn', reliability: record(9, 9) }),
      applicant({ id: 'no', sizeId: 's10', status: 'declined', reliability: record(9, 9) }),
      applicant({ id: 'nosize', sizeId: null }),
      applicant({ id: 'other', sizeId: 's22' }),
    ]);
    expect(p.picks).toEqual([]);
    expect(Object.fromEntries(p.leftOut.map((x) => [x.applicantId, [x.cause, x.reason, x.waitlistRank]]))).toEqual({
      gone: ['withdrawn', 'Left out: withdrew their application.', null],
      no: ['declined', 'Left out: already declined.', null],
      nosize: ['no-size', 'Left out: applied without a size, so there is no place to fill.', null],
      other: ['size-not-wanted', 'Left out: applied for a size this trial does not ask for.', null],
    });
  });

  it('breaks a tie in coverage and reliability by the earlier application, then by id', () => {
    const one: CoverageTargets = { sizes: [{ id: 's', label: '8', target: 1 }], heightBands: [], variants: [] };
    const early = proposeSelection(one, [
      applicant({ id: 'b', sizeId: 's', appliedAt: '2025-03-01T08:00:00Z' }),
      applicant({ id: 'a', sizeId: 's', appliedAt: '2025-03-01T09:00:00Z' }),
    ]);
    expect(pickIds(early)).toEqual(['b']);
    expect(early.picks[0]!.reason).toMatch(/as reliable as the next in line and applied earlier\.$/);
    expect(leftOutOf(early, 'a').reason).toMatch(/equally reliable applicant who applied earlier/);

    const same = '2025-03-01T08:00:00Z';
    const byId = proposeSelection(one, [
      applicant({ id: 'b', sizeId: 's', appliedAt: same }),
      applicant({ id: 'a', sizeId: 's', appliedAt: same }),
    ]);
    expect(pickIds(byId)).toEqual(['a']);
    expect(byId.picks[0]!.reason).toMatch(/fixed order by applicant id decided/);
  });

  it('covers each variant of a size before doubling up', () => {
    const withVariants: CoverageTargets = {
      sizes: [{ id: 's', label: '16', target: 2 }],
      heightBands: [],
      variants: [{ id: 'fb', name: 'the fuller-belly front' }],
    };
    // Two reliable testers on the drafted front, one newcomer on the fuller-belly front: 2 places.
    const p = proposeSelection(withVariants, [
      applicant({ id: 'd1', sizeId: 's', reliability: record(5, 5) }),
      applicant({ id: 'd2', sizeId: 's', reliability: record(5, 5) }),
      applicant({ id: 'f1', sizeId: 's', variantId: 'fb' }),
    ]);
    expect(pickIds(p).sort()).toEqual(['d1', 'f1']);
    expect(p.picks.find((x) => x.applicantId === 'f1')!.reason).toMatch(/no one yet for the fuller-belly front/);
    expect(leftOutOf(p, 'd2').reason).toMatch(/places went first to cover every variant with applicants/);
  });

  it('ranks the waitlist within each cell by reliability', () => {
    const one: CoverageTargets = { sizes: [{ id: 's', label: '8', target: 1 }], heightBands: DEFAULT_HEIGHT_BANDS, variants: [] };
    const p = proposeSelection(
      one,
      [
        applicant({ id: 'pick', sizeId: 's', heightMm: cm(165), reliability: record(6, 6) }),
        applicant({ id: 'low', sizeId: 's', heightMm: cm(166), reliability: record(1, 4) }),
        applicant({ id: 'high', sizeId: 's', heightMm: cm(167), reliability: record(4, 4) }),
        applicant({ id: 'tall', sizeId: 's', heightMm: cm(180), reliability: record(0, 4) }),
      ],
      { prior: NEUTRAL_PRIOR },
    );
    expect(pickIds(p)).toEqual(['pick']);
    expect(p.leftOut.map((x) => [x.applicantId, x.waitlistRank])).toEqual([
      ['high', 1],
      ['low', 2],
      ['tall', 1],
    ]);
  });

  it('returns the grid as it would be after the picks', () => {
    const p = proposeSelection(trousers, [
      applicant({ id: 'a', sizeId: 's10', heightMm: cm(150) }),
      applicant({ id: 'b', sizeId: 's10', heightMm: cm(180) }),
      applicant({ id: 'c', sizeId: 's10', heightMm: cm(181) }),
    ]);
    expect(p.gridAfter.rows[0]).toMatchObject({ selected: 2, remaining: 0, state: 'full' });
    expect(p.gridAfter.rows[0]!.bands.map((b) => b.selected)).toEqual([1, 0, 1]);
  });

  it('refuses duplicate applicant ids', () => {
    expect(() => proposeSelection(trousers, [applicant({ id: 'x' }), applicant({ id: 'x' })])).toThrow(/appears twice/);
  });
});

describe('best waitlisted after a withdrawal', () => {
  const apps = [
    applicant({ id: 'stay', sizeId: 's10', heightMm: cm(165), status: 'selected' }),
    applicant({ id: 'left', sizeId: 's10', heightMm: cm(180), status: 'withdrawn' }),
    applicant({ id: 'wr', sizeId: 's10', heightMm: cm(166), status: 'waitlisted', reliability: record(5, 5) }),
    applicant({ id: 'wt', sizeId: 's10', heightMm: cm(181), status: 'waitlisted', reliability: record(1, 3) }),
    applicant({ id: 'wt2', sizeId: 's10', heightMm: cm(182), status: 'waitlisted', reliability: record(0, 3) }),
    applicant({ id: 'app', sizeId: 's10', heightMm: cm(183), status: 'applied', reliability: record(9, 9) }),
  ];

  it('offers the place to the best waitlisted in the freed band', () => {
    const offer = bestWaitlisted(trousers, apps, 's10', 'tall', { prior: NEUTRAL_PRIOR });
    expect(offer).toMatchObject({ applicantId: 'wt', bandId: 'tall', sameBand: true });
    // wt: (1 + 1) / (3 + 2) = 0.40; wt2: 1 / 5 = 0.20.
    expect(offer!.reason).toBe(
      'Offer: size 10 has 1 of 2 after the withdrawal; waitlisted in the same band (the Tall band); reliability 0.40 (1 of 3 past trials finished on time); more reliable than the next on the waitlist (0.40 against 0.20).',
    );
  });

  it('without a band, prefers one who covers a band the size lacks; falls back when the band has nobody', () => {
    // Regular is covered by "stay"; tall is not, so wt comes before the more reliable wr.
    expect(bestWaitlisted(trousers, apps, 's10', undefined, { prior: NEUTRAL_PRIOR })?.applicantId).toBe('wt');
    const fallback = bestWaitlisted(trousers, apps, 's10', 'petite', { prior: NEUTRAL_PRIOR });
    expect(fallback).toMatchObject({ applicantId: 'wt', sameBand: false });
    expect(fallback!.reason).toMatch(/nobody is waitlisted in the Petite band/);
  });

  it('offers nothing when the size is full, unknown, or has nobody waitlisted', () => {
    const full = apps.map((a) => (a.id === 'left' ? { ...a, status: 'selected' as const } : a));
    expect(bestWaitlisted(trousers, full, 's10', 'tall')).toBeNull();
    expect(bestWaitlisted(trousers, apps, 's99')).toBeNull();
    expect(bestWaitlisted(trousers, apps, 's12')).toBeNull();
  });
});

// ---------------------------------------------------------------------------------------------
// Properties over random trials

const STATUSES: ApplicationStatus[] = ['applied', 'shortlisted', 'selected', 'waitlisted', 'declined', 'withdrawn'];
// Few distinct times on purpose, so ties in time happen often.
const TIMES = ['2025-03-01T08:00:00Z', '2025-03-01T09:00:00Z', '2025-03-02T08:00:00.000+01:00', 'not a date'];

const targetsArb: fc.Arbitrary<CoverageTargets> = fc.record({
  sizes: fc
    .array(fc.integer({ min: 0, max: 4 }), { minLength: 1, maxLength: 5 })
    .map((ts) => ts.map((target, i) => ({ id: `s${i}`, label: String(8 + 2 * i), target }))),
  heightBands: fc.constantFrom<HeightBand[]>([], [...DEFAULT_HEIGHT_BANDS], [
    { id: 'short', label: 'Short', minMm: cm(150), maxMm: cm(170) },
    { id: 'long', label: 'Long', minMm: cm(170), maxMm: cm(190) },
  ]),
  variants: fc.constantFrom([], [{ id: 'v1', name: 'fuller-belly front' }, { id: 'v2', name: 'D cup' }]),
});

const applicantFieldsArb = fc.record({
  appliedAt: fc.constantFrom(...TIMES),
  status: fc.constantFrom(...STATUSES),
  sizeId: fc.constantFrom(null, 's0', 's1', 's2', 's3', 's4', 'unwanted'),
  variantId: fc.constantFrom(null, 'v1', 'v2', 'v-unknown'),
  heightMm: fc.option(fc.integer({ min: cm(140), max: cm(200) }), { nil: null }),
  reliability: fc
    .tuple(fc.integer({ min: 0, max: 5 }), fc.integer({ min: 0, max: 5 }))
    .map(([a, b]) => record(Math.min(a, b), Math.max(a, b))),
});

const trialArb = fc.record({
  targets: targetsArb,
  applicants: fc
    .array(applicantFieldsArb, { maxLength: 30 })
    .map((list) => list.map((fields, i): Applicant => ({ id: `a${i}`, ...fields }))),
});

// Crowded trials: one size with few places and many look-alike applicants, so that full ties only
// the id can break, and competition between covering a band and covering a variant, are common.
const crowdedTrialArb = fc.record({
  targets: fc.record({
    sizes: fc.integer({ min: 1, max: 3 }).map((target) => [{ id: 's0', label: '12', target }]),
    heightBands: fc.constantFrom<HeightBand[]>([], [...DEFAULT_HEIGHT_BANDS]),
    variants: fc.constantFrom([], [{ id: 'v1', name: 'fuller-belly front' }]),
  }),
  applicants: fc
    .array(
      fc.record({
        appliedAt: fc.constantFrom(...TIMES.slice(0, 2)),
        status: fc.constantFrom<ApplicationStatus>('applied', 'shortlisted', 'waitlisted', 'withdrawn'),
        sizeId: fc.constant('s0'),
        variantId: fc.constantFrom(null, 'v1'),
        heightMm: fc.constantFrom(null, cm(155), cm(165), cm(180)),
        reliability: fc.constantFrom(record(0, 0), record(2, 2)),
      }),
      { minLength: 6, maxLength: 20 },
    )
    .map((list) => list.map((fields, i): Applicant => ({ id: `a${i}`, ...fields }))),
});

const ELIGIBLE = new Set<ApplicationStatus>(['applied', 'shortlisted', 'waitlisted']);

function sizeOf(targets: CoverageTargets, a: Applicant) {
  return targets.sizes.find((s) => s.id === a.sizeId);
}

describe('proposed selection, properties', () => {
  it('never gives a size more new picks than it has open places', () => {
    fc.assert(
      fc.property(trialArb, fc.option(fc.nat({ max: 10 }), { nil: undefined }), ({ targets, applicants }, maxNewPicks) => {
        const p = proposeSelection(targets, applicants, { maxNewPicks });
        for (const size of targets.sizes) {
          const kept = applicants.filter((a) => a.status === 'selected' && a.sizeId === size.id).length;
          const added = p.picks.filter((x) => x.kind === 'new' && x.sizeId === size.id).length;
          expect(added).toBeLessThanOrEqual(Math.max(0, size.target - kept));
          const row = p.gridAfter.rows.find((r) => r.sizeId === size.id)!;
          expect(row.selected).toBeLessThanOrEqual(Math.max(size.target, kept));
        }
        if (maxNewPicks != null) expect(pickIds(p, 'new').length).toBeLessThanOrEqual(maxNewPicks);
      }),
    );
  });

  it('never picks a withdrawn or declined applicant, and only wanted sizes get new picks', () => {
    fc.assert(
      fc.property(trialArb, ({ targets, applicants }) => {
        const p = proposeSelection(targets, applicants);
        const byId = new Map(applicants.map((a) => [a.id, a]));
        for (const pick of p.picks) {
          const a = byId.get(pick.applicantId)!;
          expect(['withdrawn', 'declined']).not.toContain(a.status);
          if (pick.kind === 'new') {
            expect(ELIGIBLE.has(a.status)).toBe(true);
            expect(sizeOf(targets, a)).toBeDefined();
          }
        }
      }),
    );
  });

  it('keeps every already-selected applicant', () => {
    fc.assert(
      fc.property(trialArb, ({ targets, applicants }) => {
        const p = proposeSelection(targets, applicants);
        const kept = new Set(pickIds(p, 'kept'));
        expect(kept).toEqual(new Set(applicants.filter((a) => a.status === 'selected').map((a) => a.id)));
      }),
    );
  });

  it('picks or leaves out every applicant exactly once, each with a reason', () => {
    fc.assert(
      fc.property(trialArb, ({ targets, applicants }) => {
        const p = proposeSelection(targets, applicants);
        const ids = [...pickIds(p), ...p.leftOut.map((x) => x.applicantId)].sort();
        expect(ids).toEqual(applicants.map((a) => a.id).sort());
        for (const x of p.picks) expect(x.reason).toMatch(x.kind === 'kept' ? /^Kept: \S/ : /^Picked: size \S/);
        for (const x of p.leftOut) expect(x.reason).toMatch(/^Left out: \S/);
      }),
    );
  });

  it('fills every size up to its target, and every band with an applicant, when enough applicants exist', () => {
    fc.assert(
      fc.property(fc.oneof(trialArb, crowdedTrialArb), ({ targets, applicants }) => {
        const p = proposeSelection(targets, applicants);
        const picked = new Set(pickIds(p));
        for (const size of targets.sizes) {
          const mine = applicants.filter((a) => a.sizeId === size.id);
          const kept = mine.filter((a) => a.status === 'selected');
          const eligible = mine.filter((a) => ELIGIBLE.has(a.status));
          const open = Math.max(0, size.target - kept.length);
          const added = eligible.filter((a) => picked.has(a.id)).length;
          // Every open place is filled, as far as there are applicants for it.
          expect(added).toBe(Math.min(open, eligible.length));

          // Bands where someone eligible applied but no one is kept: each gets a tester when the
          // open places are at least as many as such bands.
          const band = (a: Applicant) => bandOf(a.heightMm, targets.heightBands)?.id;
          const keptBands = new Set(kept.map(band));
          const wanted = new Set(eligible.map(band).filter((b) => b != null && !keptBands.has(b)));
          if (open >= wanted.size) {
            const coveredAfter = new Set(mine.filter((a) => picked.has(a.id)).map(band));
            for (const b of wanted) expect(coveredAfter).toContain(b);
          }
        }
      }),
      { numRuns: 300 },
    );
  });

  it('gives the same proposal for the same applicants in any order', () => {
    fc.assert(
      fc.property(
        fc.oneof(trialArb, crowdedTrialArb).chain((trial) =>
          fc.record({ trial: fc.constant(trial), shuffled: fc.shuffledSubarray(trial.applicants, { minLength: trial.applicants.length }) }),
        ),
        ({ trial, shuffled }) => {
          const first = proposeSelection(trial.targets, trial.applicants);
          const again = proposeSelection(trial.targets, trial.applicants);
          const reordered = proposeSelection(trial.targets, shuffled);
          expect(again).toEqual(first);
          expect(reordered.picks).toEqual(first.picks);
          expect(reordered.leftOut).toEqual(first.leftOut);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('ranks a waitlist 1, 2, … within each cell, only for those who could take a freed place', () => {
    fc.assert(
      fc.property(trialArb, ({ targets, applicants }) => {
        const p = proposeSelection(targets, applicants);
        const cells = new Map<string, number[]>();
        for (const x of p.leftOut) {
          if (x.waitlistRank == null) continue;
          expect(['size-full', 'size-already-full', 'limit-reached']).toContain(x.cause);
          const k = JSON.stringify([x.sizeId, x.bandId, x.variantId]);
          cells.set(k, [...(cells.get(k) ?? []), x.waitlistRank]);
        }
        for (const ranks of cells.values()) expect([...ranks].sort((a, b) => a - b)).toEqual(ranks.map((_, i) => i + 1));
      }),
    );
  });
});

describe('best waitlisted, properties', () => {
  it('offers a waitlisted applicant of the freed size while it has an open place, else nothing', () => {
    fc.assert(
      fc.property(trialArb, fc.nat({ max: 4 }), ({ targets, applicants }, n) => {
        const sizeId = `s${n}`;
        const size = targets.sizes.find((s) => s.id === sizeId);
        const offer = bestWaitlisted(targets, applicants, sizeId);
        const waiting = applicants.filter((a) => a.status === 'waitlisted' && a.sizeId === sizeId);
        const selected = applicants.filter((a) => a.status === 'selected' && a.sizeId === sizeId).length;
        if (!size || waiting.length === 0 || selected >= size.target) {
          expect(offer).toBeNull();
        } else {
          expect(waiting.map((a) => a.id)).toContain(offer!.applicantId);
          expect(offer!.reason).toMatch(/^Offer: size \S/);
        }
      }),
    );
  });
});
