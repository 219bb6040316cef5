// Reasons from the engine in the reader's unit. Expected values by hand from 1 in = 25.4 mm exactly
// (1959 international yard and pound agreement): 9 mm = 0.354 in → 3/8 in to the nearest eighth;
// 42.5 mm = 1.673 in → 1 5/8 in; 3 mm = 0.118 in → 1/8 in; 9 mm = 0.9 cm.
import { reasonInUnit } from '@/components/findings/words';
import { mm } from '@/server/analysis/wording';

describe('reasonInUnit', () => {
  const reason = `8 of 17 testers made crotch-curve-scoop (add), median ${mm(9)}; the amount grows by ${mm(3)} per size step; leg length median ${mm(-42.5)} (p = 0.0006).`;

  it('turns every millimetre amount into inches, keeping the sign and the rest of the words', () => {
    expect(reasonInUnit(reason, 'in')).toBe('8 of 17 testers made crotch-curve-scoop (add), median 3/8 in; the amount grows by 1/8 in per size step; leg length median -1 5/8 in (p = 0.0006).');
  });

  it('and into centimetres', () => {
    expect(reasonInUnit(`median ${mm(9)}`, 'cm')).toBe('median 0.9 cm');
  });

  it('leaves words without an amount in millimetres alone', () => {
    expect(reasonInUnit('3 of 4 testers (75%), p = 0.05', 'in')).toBe('3 of 4 testers (75%), p = 0.05');
  });
});
