// The fabric-used section of a report. Expected millimetres by hand from the exact definitions
// 1 in = 25.4 mm and 1 yd = 0.9144 m (international yard and pound agreement, 1959):
// 54 in = 1371.6 mm; 2 1/4 yd = 2.25 × 914.4 = 2057.4 mm.
import { fireEvent, render, screen } from '@testing-library/react-native';
import { useState } from 'react';
import { EMPTY_FABRIC, FabricUsedEditor } from '@/components/reports/fabric-used-editor';
import type { ReportDraft } from '@/server/domain/schemas/reports';

type Fabric = NonNullable<ReportDraft['fabric']>;

function Harness({ onChange }: { onChange: (f: Fabric) => void }) {
  const [value, setValue] = useState<Fabric | undefined>(undefined);
  return (
    <FabricUsedEditor
      value={value}
      lengthUnit="in"
      fabricUnit="yd"
      readOnly={false}
      onChange={(next) => {
        setValue(next);
        onChange(next);
      }}
    />
  );
}

function typeAndLeave(label: string, text: string) {
  const input = screen.getByLabelText(label);
  fireEvent(input, 'focus');
  fireEvent.changeText(input, text);
  fireEvent(input, 'blur');
}

describe('FabricUsedEditor', () => {
  it('sends the whole fabric each time, with widths in the length unit and the length used in yards', () => {
    const onChange = jest.fn();
    render(<Harness onChange={onChange} />);
    fireEvent.changeText(screen.getByLabelText('Fabric'), 'Cotton twill');
    expect(onChange).toHaveBeenLastCalledWith({ ...EMPTY_FABRIC, kind: 'Cotton twill' });
    typeAndLeave('Fabric width', '54');
    expect(onChange.mock.lastCall[0].widthMm).toBeCloseTo(1371.6, 9);
    typeAndLeave('Length used', '2 1/4');
    expect(onChange.mock.lastCall[0].usedMm).toBeCloseTo(2057.4, 9);
    expect(onChange.mock.lastCall[0].kind).toBe('Cotton twill');
  });

  it('reads the stretch as a percentage, and names a stretch it cannot read without sending it', () => {
    const onChange = jest.fn();
    render(<Harness onChange={onChange} />);
    fireEvent.changeText(screen.getByLabelText('Stretch (%)'), '20 %');
    expect(onChange.mock.lastCall[0].stretchPct).toBe(20);
    const calls = onChange.mock.calls.length;
    fireEvent.changeText(screen.getByLabelText('Stretch (%)'), 'lots');
    expect(onChange.mock.calls.length).toBe(calls);
    expect(screen.getByText(/Write a number, e.g. 20/)).toBeTruthy();
    fireEvent.changeText(screen.getByLabelText('Stretch (%)'), '');
    expect(onChange.mock.lastCall[0].stretchPct).toBeNull();
  });

  it('marks napped or one-way fabric with a tap anywhere on the switch’s row, words included', () => {
    const onChange = jest.fn();
    render(<Harness onChange={onChange} />);
    expect(screen.getByRole('switch', { name: /^Napped or one-way fabric/, checked: false })).toBeTruthy();
    fireEvent.press(screen.getByText('Napped or one-way fabric'));
    expect(onChange.mock.lastCall[0].napped).toBe(true);
  });
});
