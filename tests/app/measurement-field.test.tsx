// The unit-aware length input. Expected millimetres by hand from 1 in = 25.4 mm exactly (the
// international yard and pound agreement of 1959, tests/reference/SOURCES.md §5): 1 3/8 in = 11 × 25.4 / 8 =
// 34.925 mm; 1/2 in = 12.7 mm; 35 mm = 1.378 in, shown to the nearest 1/8 as 1 3/8 in.
import { act, fireEvent, render, screen, waitFor } from '@testing-library/react-native';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { Pressable, Text, View } from 'react-native';
import { MeasurementField } from '@/components/ui/measurement-field';
import type { LengthUnit } from '@/server/domain/units';

/** A parent that keeps the value, as a form would. */
function Harness({
  unit,
  initialMm = null,
  onChangeMm,
  allowNegative,
  error,
}: {
  unit: LengthUnit;
  initialMm?: number | null;
  onChangeMm: (mm: number | null) => void;
  allowNegative?: boolean;
  error?: string;
}) {
  const [valueMm, setValueMm] = useState<number | null>(initialMm);
  return (
    <MeasurementField
      label="Hip"
      hint="Around the fullest part of the seat."
      valueMm={valueMm}
      unit={unit}
      allowNegative={allowNegative}
      error={error}
      onChangeMm={(mm) => {
        setValueMm(mm);
        onChangeMm(mm);
      }}
    />
  );
}

function typeAndLeave(text: string) {
  const input = screen.getByLabelText('Hip');
  fireEvent(input, 'focus');
  fireEvent.changeText(input, text);
  fireEvent(input, 'blur');
  return input;
}

describe('MeasurementField', () => {
  it('reads "1 3/8" as inches for an inch user, stores 34.925 mm and shows "1 3/8 in"', () => {
    const onChangeMm = jest.fn();
    render(<Harness unit="in" onChangeMm={onChangeMm} />);
    typeAndLeave('1 3/8');
    expect(onChangeMm).toHaveBeenCalledTimes(1);
    expect(onChangeMm.mock.calls[0][0]).toBeCloseTo(34.925, 9);
    expect(screen.getByLabelText('Hip').props.value).toBe('1 3/8 in');
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('takes "3.5 cm" from an inch user as 35 mm and shows it back in inches', () => {
    const onChangeMm = jest.fn();
    render(<Harness unit="in" onChangeMm={onChangeMm} />);
    typeAndLeave('3.5 cm');
    expect(onChangeMm).toHaveBeenCalledWith(35);
    expect(screen.getByLabelText('Hip').props.value).toBe('1 3/8 in');
  });

  it('refuses "abc" with a message that starts with the label and names the accepted forms, keeping the value', () => {
    const onChangeMm = jest.fn();
    render(<Harness unit="in" initialMm={1000} onChangeMm={onChangeMm} />);
    typeAndLeave('abc');
    expect(onChangeMm).not.toHaveBeenCalled();
    const alert = screen.getByRole('alert');
    expect(alert).toHaveTextContent(/^Hip: could not be read: use a form such as 1 3\/8, 1-3\/8, 1\.375 in/);
    // What was typed stays, so it can be corrected.
    expect(screen.getByLabelText('Hip').props.value).toBe('abc');

    // Correcting it clears the message.
    typeAndLeave('40');
    expect(onChangeMm).toHaveBeenCalledWith(1016);
    expect(screen.queryByRole('alert')).toBeNull();
    expect(screen.getByLabelText('Hip').props.value).toBe('40 in');
  });

  it('reads a height in feet and inches: "5 ft 2" from a metric user is 62 in = 1574.8 mm, shown as 157.5 cm', () => {
    const onChangeMm = jest.fn();
    render(<Harness unit="cm" onChangeMm={onChangeMm} />);
    typeAndLeave('5 ft 2');
    expect(onChangeMm.mock.calls[0][0]).toBeCloseTo(1574.8, 9);
    expect(screen.getByLabelText('Hip').props.value).toBe('157.5 cm');
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('with commitWhileTyping, hands on each readable value as it is typed and leaves the text alone until blur', () => {
    const onChangeMm = jest.fn();
    render(<MeasurementField label="Amount" valueMm={null} unit="in" allowNegative commitWhileTyping onChangeMm={onChangeMm} />);
    const input = screen.getByLabelText('Amount');
    fireEvent(input, 'focus');
    fireEvent.changeText(input, '-1');
    fireEvent.changeText(input, '-1 1/');
    fireEvent.changeText(input, '-1 1/2');
    // "-1 1/" is not readable: nothing is handed on for it.
    expect(onChangeMm).toHaveBeenCalledTimes(2);
    expect(onChangeMm.mock.calls[0][0]).toBeCloseTo(-25.4, 9);
    expect(onChangeMm.mock.calls[1][0]).toBeCloseTo(-38.1, 9);
    expect(input.props.value).toBe('-1 1/2');
  });

  it('shows a metric user centimetres to one decimal: 35 typed → 350 mm → "35.0 cm"', () => {
    const onChangeMm = jest.fn();
    render(<Harness unit="cm" onChangeMm={onChangeMm} />);
    typeAndLeave('35');
    expect(onChangeMm).toHaveBeenCalledWith(350);
    expect(screen.getByLabelText('Hip').props.value).toBe('35.0 cm');
  });

  it('shows a stored value in the unit given, and again when the unit changes', () => {
    const onChangeMm = jest.fn();
    const { rerender } = render(<Harness unit="cm" initialMm={34.925} onChangeMm={onChangeMm} />);
    expect(screen.getByLabelText('Hip').props.value).toBe('3.5 cm');
    rerender(<Harness unit="in" initialMm={34.925} onChangeMm={onChangeMm} />);
    expect(screen.getByLabelText('Hip').props.value).toBe('1 3/8 in');
    expect(onChangeMm).not.toHaveBeenCalled();
  });

  it('tells a metric user that a bare fraction is inches', () => {
    const onChangeMm = jest.fn();
    render(<Harness unit="cm" onChangeMm={onChangeMm} />);
    typeAndLeave('1 3/8');
    expect(onChangeMm).not.toHaveBeenCalled();
    expect(screen.getByRole('alert')).toHaveTextContent(/^Hip: fractions are inches: add in or "/);
  });

  it('does not re-read the rounded text when the person only passes through the field', () => {
    // 35 mm is shown as 1 3/8 in; reading that back would store 34.925 mm instead.
    const onChangeMm = jest.fn();
    render(<Harness unit="in" initialMm={35} onChangeMm={onChangeMm} />);
    const input = screen.getByLabelText('Hip');
    fireEvent(input, 'focus');
    fireEvent(input, 'blur');
    expect(onChangeMm).not.toHaveBeenCalled();
  });

  it('clears the value when the field is emptied', () => {
    const onChangeMm = jest.fn();
    render(<Harness unit="in" initialMm={1000} onChangeMm={onChangeMm} />);
    typeAndLeave('  ');
    expect(onChangeMm).toHaveBeenCalledWith(null);
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('takes signed amounts only when allowed', () => {
    const allowed = jest.fn();
    const { unmount } = render(<Harness unit="in" allowNegative onChangeMm={allowed} />);
    typeAndLeave('−1/2');
    expect(allowed.mock.calls[0][0]).toBeCloseTo(-12.7, 9);
    expect(screen.getByLabelText('Hip').props.value).toBe('-1/2 in');
    unmount();

    const refused = jest.fn();
    render(<Harness unit="in" onChangeMm={refused} />);
    typeAndLeave('-1/2');
    expect(refused).not.toHaveBeenCalled();
    expect(screen.getByRole('alert')).toHaveTextContent(/^Hip: cannot be negative/);
  });

  it('shows an error from the form with the label in front', () => {
    render(<Harness unit="cm" initialMm={30} onChangeMm={jest.fn()} error="3.0 cm is outside the plausible range" />);
    expect(screen.getByRole('alert')).toHaveTextContent('Hip: 3.0 cm is outside the plausible range');
  });

  it('works inside react-hook-form through a Controller', async () => {
    const onSubmit = jest.fn();
    function Form() {
      const { control, handleSubmit } = useForm<{ hip: number | null }>({ defaultValues: { hip: null } });
      return (
        <View>
          <Controller
            control={control}
            name="hip"
            render={({ field }) => (
              <MeasurementField label="Hip" unit="in" valueMm={field.value} onChangeMm={field.onChange} onBlur={field.onBlur} />
            )}
          />
          <Pressable role="button" onPress={handleSubmit((values) => onSubmit(values))}>
            <Text>Save</Text>
          </Pressable>
        </View>
      );
    }
    render(<Form />);
    typeAndLeave('38 3/4');
    await act(async () => {
      fireEvent.press(screen.getByRole('button', { name: 'Save' }));
    });
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    // 38 3/4 in = 38.75 × 25.4 = 984.25 mm (by hand)
    expect(onSubmit.mock.calls[0][0].hip).toBeCloseTo(984.25, 9);
    expect(screen.getByLabelText('Hip').props.value).toBe('38 3/4 in');
  });
});
