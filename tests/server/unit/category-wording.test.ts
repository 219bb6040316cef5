import {
  bodyMeasurementsFor,
  fabricExamples,
  finishedMeasurementsFor,
  heightPlaceholder,
  measurementPlaceholder,
  newVariantFor,
  offersFullerBelly,
  variantExplanation,
  variantKindsFor,
} from '../../../server/domain/category-wording';
import { GARMENT_CATEGORY_KEYS } from '../../../server/domain/garments';
import { MEASUREMENTS } from '../../../server/domain/measurements';
import { parseLength } from '../../../server/domain/units';

describe('wording and defaults that follow the garment', () => {
  it('a knit top is offered cup sizes, not a fuller-belly front, and no crotch, inseam or leg columns', () => {
    expect(variantKindsFor('top')).toEqual(['cup', 'other']);
    expect(offersFullerBelly('top')).toBe(false);
    expect(newVariantFor('top', ['bust', 'waist'])).toEqual({ name: 'Fuller cup', kind: 'cup', columns: ['bust'] });
    const body = bodyMeasurementsFor('top');
    for (const trouserOnly of ['inseam', 'outseam', 'crotch_depth_seated', 'total_crotch_length', 'thigh', 'knee', 'calf']) expect(body).not.toContain(trouserOnly);
    expect(body).toEqual(expect.arrayContaining(['bust', 'high_bust', 'waist', 'shoulder_width']));
    expect(finishedMeasurementsFor('top')).not.toEqual(expect.arrayContaining(['inseam']));
    expect(variantExplanation('top')).toBe('A variant (a cup size) replaces some body measurements in the sizes it is drafted for.');
    expect(fabricExamples('knit')).toMatch(/jersey/);
    expect(fabricExamples('knit')).not.toMatch(/twill|linen/);
  });

  it('trousers are offered the fuller-belly front (starting from the waist column) and the leg and crotch columns', () => {
    expect(variantKindsFor('trousers')).toEqual(['fuller-belly', 'other']);
    expect(newVariantFor('trousers', ['waist', 'hip'])).toEqual({ name: 'Fuller belly front', kind: 'fuller-belly', columns: ['waist'] });
    expect(newVariantFor('trousers', ['hip'])).toEqual({ name: 'Fuller belly front', kind: 'fuller-belly', columns: [] });
    expect(bodyMeasurementsFor('trousers')).toEqual(expect.arrayContaining(['waist', 'hip', 'thigh', 'inseam', 'crotch_depth_seated']));
    expect(bodyMeasurementsFor('trousers')).not.toContain('bust');
    expect(fabricExamples('woven')).toMatch(/twill/);
  });

  it('a skirt has no leg or crotch columns; a dress or jumpsuit gets both halves and both variants', () => {
    expect(bodyMeasurementsFor('skirt')).toEqual(['waist', 'high_hip', 'hip', 'height']);
    expect(finishedMeasurementsFor('skirt')).not.toContain('inseam');
    expect(variantKindsFor('dress')).toEqual(['fuller-belly', 'cup', 'other']);
    expect(bodyMeasurementsFor('jumpsuit')).toEqual(expect.arrayContaining(['bust', 'inseam']));
  });

  it('every category offers "other" and at least its sizing measurements', () => {
    for (const category of GARMENT_CATEGORY_KEYS) {
      expect(variantKindsFor(category)).toContain('other');
      expect(bodyMeasurementsFor(category).length).toBeGreaterThanOrEqual(4);
      expect(bodyMeasurementsFor(category)).toContain('height');
    }
  });

  it('each measurement’s example reads back as a plausible value of that measurement, in both units; height in feet and inches', () => {
    expect(heightPlaceholder('in')).toBe('e.g. 5 ft 5');
    expect(heightPlaceholder('cm')).toBe('e.g. 165 cm');
    for (const m of MEASUREMENTS) {
      for (const unit of ['in', 'cm'] as const) {
        const example = measurementPlaceholder(m.key, unit).replace(/^e\.g\. /, '');
        const read = parseLength(example, unit);
        if (!read.ok) throw new Error(`${m.key} ${unit}: ${example} does not read back`);
        expect(read.mm).toBeGreaterThanOrEqual(m.minMm);
        expect(read.mm).toBeLessThanOrEqual(m.maxMm);
      }
    }
    // A height is not shown as a trouser length.
    expect(measurementPlaceholder('height', 'in')).not.toBe(measurementPlaceholder('inseam', 'in'));
  });
});
