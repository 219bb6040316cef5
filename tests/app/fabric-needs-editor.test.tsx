// The pattern's fabric-needs table: stated needs shown rounded up, and a one-way need below the plain
// need for the same size and width marked on its cell and not sent. Millimetres by hand from the
// exact definition 1 yd = 914.4 mm (1959 yard and pound agreement), so 1/8 yd = 114.3 mm.
import { fireEvent, render, screen, waitFor } from '@testing-library/react-native';
import { SWRConfig } from 'swr';
import { FabricNeedsEditor } from '@/components/patterns/fabric-needs-editor';
import { fetcher } from '@/hooks/api';
import type { PatternDetail } from '@/hooks/use-patterns';

const pattern: PatternDetail = {
  id: 'p1',
  name: 'Corduroy trousers',
  category: 'trousers',
  childrensWear: false,
  fabricKind: 'woven',
  minStretchPct: null,
  archived: false,
  sizes: ['10'],
  updatedAt: '2026-01-01T00:00:00Z',
  notes: null,
  chart: { draftedHeightMm: null, bodyColumns: ['hip'], finishedColumns: [], sizes: [{ id: 's10', label: '10', bodyMm: {}, finishedMm: {} }], variants: [] },
  // 45 in = 1143 mm wide; plain 2300 mm, one way 2.75 yd = 2514.6 mm
  fabricNeeds: [
    { sizeId: 's10', widthMm: 1143, napped: false, lengthMm: 2300 },
    { sizeId: 's10', widthMm: 1143, napped: true, lengthMm: 2514.6 },
  ],
};

type Call = { url: string; method: string; body: { needs: unknown[] } | undefined };

function serve(answer: (body: { needs: unknown[] }) => Response) {
  const calls: Call[] = [];
  global.fetch = jest.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const body = init?.body ? JSON.parse(String(init.body)) : undefined;
    calls.push({ url: String(input), method: init?.method ?? 'GET', body });
    return answer(body);
  }) as typeof fetch;
  return calls;
}

const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

const wrap = () =>
  render(
    <SWRConfig value={{ provider: () => new Map(), fetcher, dedupingInterval: 0 }}>
      <FabricNeedsEditor studioId="st" pattern={pattern} lengthUnit="in" fabricUnit="yd" canEdit />
    </SWRConfig>,
  );

function typeAndLeave(label: string, text: string) {
  const input = screen.getByLabelText(label);
  fireEvent(input, 'focus');
  fireEvent.changeText(input, text);
  fireEvent(input, 'blur');
}

describe('FabricNeedsEditor', () => {
  it('shows a stated need of 2300 mm as 2 5/8 yd (rounded up), never 2 1/2 yd (2286 mm, short)', () => {
    serve(() => json(pattern));
    wrap();
    expect(screen.getByLabelText('Fabric 45 in wide, size 10').props.value).toBe('2 5/8 yd');
    expect(screen.getByLabelText('Fabric 45 in, one way, size 10').props.value).toBe('2 3/4 yd');
  });

  it('marks a one-way need below the plain need on its cell, and does not send it', async () => {
    const calls = serve(() => json(pattern));
    wrap();
    typeAndLeave('Fabric 45 in, one way, size 10', '2 1/4');
    expect(screen.getByText('Fabric 45 in, one way, size 10: is below the 2 5/8 yd stated without a one-way layout')).toBeTruthy();
    expect(screen.getByText(/^Size 10, 45 in wide, one way: 2 1\/4 yd is less than the 2 5\/8 yd/)).toBeTruthy();
    fireEvent.press(screen.getByRole('button', { name: 'Save fabric needs' }));
    await screen.findByText('Not saved: correct the one-way lengths marked in the table first.');
    expect(calls.filter((c) => c.method === 'PUT')).toEqual([]);

    // Corrected, it is sent with the typed lengths (3 yd = 2743.2 mm).
    typeAndLeave('Fabric 45 in, one way, size 10', '3');
    expect(screen.queryByText(/is below the/)).toBeNull();
    fireEvent.press(screen.getByRole('button', { name: 'Save fabric needs' }));
    await screen.findByText('Fabric needs saved.');
    const put = calls.find((c) => c.method === 'PUT')!;
    expect(put.url).toBe('/api/studios/st/patterns/p1/fabric-needs');
    expect(put.body?.needs).toEqual([
      { size: 's10', widthMm: 1143, napped: false, lengthMm: 2300 },
      { size: 's10', widthMm: 1143, napped: true, lengthMm: expect.closeTo(2743.2, 9) },
    ]);
  });

  it('puts the server’s refusal of a cell on that cell', async () => {
    serve(() =>
      json(
        { error: { code: 'invalid_input', message: 'Some fabric needs could not be saved; nothing was changed.', fields: { 'needs.0.lengthMm': 'refused by the server for a test' } } },
        400,
      ),
    );
    wrap();
    fireEvent.press(screen.getByRole('button', { name: 'Save fabric needs' }));
    await waitFor(() => expect(screen.getByText('Fabric 45 in wide, size 10: refused by the server for a test')).toBeTruthy());
    expect(screen.getByText(/Some fabric needs could not be saved; nothing was changed\. refused by the server for a test/)).toBeTruthy();
  });
});
