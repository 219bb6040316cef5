// Banners name refused answers by the labels the person sees, never by the fields' code names.
import { applyApiError, describeApiError } from '@/components/forms/api-errors';
import { ApiError } from '@/hooks/api';

const refused = (fields: Record<string, string>) => {
  const n = Object.keys(fields).length;
  return new ApiError(400, 'invalid_input', n === 1 ? 'One answer needs a change.' : `${n} answers need a change.`, fields);
};

describe('error banners', () => {
  it('name each refused answer by its label', () => {
    const error = refused({ experience: 'Choose your sewing experience', deadlinesConfirmed: 'Please confirm you can meet the deadlines' });
    expect(describeApiError(error, { experience: 'Sewing experience', deadlinesConfirmed: 'Deadlines' })).toBe('2 answers need a change. Please check: Sewing experience, Deadlines.');
  });

  it('use the longest labelled part of a nested path, and never show a code name', () => {
    const error = refused({ 'milestones.selection': 'is before …', 'coverage.sizes.0.target': 'At least 1 tester' });
    const text = describeApiError(error, { milestones: 'Dates', 'milestones.selection': 'Testers chosen' });
    expect(text).toBe('2 answers need a change. Please check: Testers chosen, another answer.');
    expect(text).not.toMatch(/milestones|coverage|target/);
  });

  it('leave other failures as the server said them', () => {
    expect(describeApiError(new ApiError(409, 'conflict', 'You have applied to this call already; see My trials.'), {})).toBe('You have applied to this call already; see My trials.');
    expect(describeApiError(new Error('offline'), {})).toBe('offline');
  });

  it('a form that shows every refused field beside it needs no banner; one it cannot place is named', () => {
    const setError = jest.fn();
    expect(applyApiError(refused({ 'measurementsMm.hip': 'is too small' }), setError, ['measurementsMm'], { 'measurementsMm.hip': 'Hip' })).toBeNull();
    expect(setError).toHaveBeenCalledWith('measurementsMm.hip', { type: 'server', message: 'is too small' });
    expect(applyApiError(refused({ patternId: 'Choose a pattern' }), jest.fn(), ['title'], { patternId: 'Pattern to test' })).toBe('One answer needs a change. Please check: Pattern to test.');
  });
});
