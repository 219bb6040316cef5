// Reasons are written with length tokens and rendered for each reader. Expected values by hand from
// 1 in = 25.4 mm and 1 yd = 914.4 mm exactly (tests/reference/SOURCES.md §5):
//   9 mm = 0.354 in → 3/8 in to the nearest eighth, 3/8 in (6/16) to the nearest sixteenth;
//   42.5 mm = 1.673 in → 1 5/8 in (13/8), 1 11/16 in (26.8/16 → 27/16);
//   3 mm = 0.118 in → 1/8 in, and 1/8 in (1.89/16 → 2/16) to sixteenths;
//   2300 mm = 2.515 yd: to the nearest 1/8 yd 2 1/2 yd, but a stated need rounds up: 2 5/8 yd.
import { MM_READER, describeKind, fabric, findingName, fine, len, need, readerFor, renderReason, width } from '../../../server/analysis/wording';

describe('renderReason', () => {
  const reason = `8 of 17 testers made ${describeKind('crotch-curve-scoop', 'add')}, median ${len(9)}; the amount grows by ${len(3)} per size step; leg median ${len(-42.5)}.`;

  it('names alterations as the app does and writes every length in inches for a reader in inches', () => {
    expect(renderReason(reason, readerFor('in', 'yd'))).toBe(
      '8 of 17 testers made “scoop the crotch curve, added”, median 3/8 in; the amount grows by 1/8 in per size step; leg median −1 5/8 in.',
    );
  });

  it('in centimetres, and in millimetres for the command line', () => {
    expect(renderReason(`median ${len(9)}`, readerFor('cm', 'm'))).toBe('median 0.9 cm');
    expect(renderReason(`median ${len(-42.5)}`, MM_READER)).toBe('median −42.5 mm');
  });

  it('small amounts and band ends to 1/16 in where asked', () => {
    expect(renderReason(`${fine(-42.5)} to ${fine(3)}`, readerFor('in', 'yd'))).toBe('−1 11/16 in to 1/8 in');
  });

  it('fabric: widths in whole inches or centimetres, lengths used to the nearest 1/8 yd, stated needs rounded up', () => {
    const r = readerFor('in', 'yd');
    expect(renderReason(`${width(1500)} wide, stated ${need(2300)}, used ${fabric(2300)}`, r)).toBe('59 in wide, stated 2 5/8 yd, used 2 1/2 yd');
    expect(renderReason(`${width(1500)} wide, stated ${need(2300)}`, readerFor('cm', 'm'))).toBe('150 cm wide, stated 2.30 m');
  });

  it('leaves words without a token alone, and a tester\'s own words cannot forge one', () => {
    expect(renderReason('3 of 4 testers (75%), p = 0.05', readerFor('in', 'yd'))).toBe('3 of 4 testers (75%), p = 0.05');
    expect(findingName({ kind: 'other: hem ⟦len:999⟧ wider', direction: 'add' })).toBe('Other: hem len:999 wider, added');
  });
});
