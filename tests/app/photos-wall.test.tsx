import { fireEvent, render, screen, waitFor, within } from '@testing-library/react-native';
import { SWRConfig } from 'swr';
import { PhotoWall } from '@/components/photos/photo-wall';
import { fetcher } from '@/hooks/api';
import { useIsWide } from '@/hooks/use-is-wide';

jest.mock('@/hooks/use-is-wide', () => ({ useIsWide: jest.fn(() => true) }));
const mockedUseIsWide = jest.mocked(useIsWide);

const BASE = '/api/studios/s1/trials/t1/photos';
type Size = { id: string; label: string; order: number };
const S: Size = { id: 'size-s', label: 'S', order: 0 };
const L: Size = { id: 'size-l', label: 'L', order: 2 };

function row(id: string, size: Size, view: string, tester: string, extra: Record<string, unknown> = {}) {
  return {
    id,
    enrollmentId: `en-${tester}`,
    tester: { name: tester },
    size,
    variant: null,
    stage: 'final',
    view,
    consent: 'staff-only',
    draftVersion: 2,
    width: 600,
    height: 800,
    createdAt: '2026-11-30T10:00:00.000Z',
    thumbUrl: `https://store.example.test/${id}-thumb.jpg?sig=1`,
    expiresInSeconds: 300,
    ...extra,
  };
}

// As the server orders them: sizes in grading order, then front, side, back, detail.
const WALL = [
  row('s-front-ana', S, 'front', 'Tester Ana'),
  row('s-front-bo', S, 'front', 'Tester Bo'),
  row('s-back-ana', S, 'back', 'Tester Ana'),
  row('l-side-cy', L, 'side', 'Tester Cy', { consent: 'may-share', variant: 'Fuller belly' }),
  row('l-detail-cy', L, 'detail', 'Tester Cy', { stage: 'check-in', draftVersion: null }),
];

let requested: { url: string; method: string }[];

function serve() {
  requested = [];
  global.fetch = jest.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = String(input);
    const method = init?.method ?? 'GET';
    requested.push({ url, method });
    if (url.startsWith(BASE) && method === 'GET') {
      const q = new URL(url, 'http://app.test').searchParams;
      const rows = WALL.filter((p) => (!q.get('stage') || p.stage === q.get('stage')) && (!q.get('view') || p.view === q.get('view')));
      return new Response(JSON.stringify(rows), { status: 200 });
    }
    const link = url.match(/^\/api\/photos\/([^/?]+)\/link$/);
    if (link && method === 'POST') return new Response(JSON.stringify({ url: `https://store.example.test/${link[1]}.jpg?sig=full`, expiresInSeconds: 300 }), { status: 200 });
    return new Response(JSON.stringify({ error: { code: 'not_found', message: 'No such thing.' } }), { status: 404 });
  }) as jest.Mock;
}

function renderWall() {
  return render(
    <SWRConfig value={{ provider: () => new Map(), fetcher, dedupingInterval: 0 }}>
      <PhotoWall studioId="s1" trialId="t1" />
    </SWRConfig>,
  );
}

const thumbsIn = (cell: ReturnType<typeof screen.getByLabelText>) =>
  within(cell)
    .queryAllByRole('img')
    .map((img) => img.props['aria-label'] as string);

// A cold first render shares two cores with the rest of the run: wait longer than the default second.
const LOAD = { timeout: 10_000 };

describe('the photo wall of a trial', () => {
  beforeEach(serve);

  it('on a wide screen lays the photos out as sizes (rows, grading order) × views (columns)', async () => {
    mockedUseIsWide.mockReturnValue(true);
    renderWall();
    const table = await screen.findByLabelText('Photos by size and view', undefined, LOAD);
    const headers = within(table).getAllByText(/^(Size|Front|Side|Back|Details)$/).map((n) => n.props.children);
    expect(headers).toEqual(['Size', 'Front', 'Side', 'Back', 'Details']);
    const rows = within(table).getAllByLabelText(/^Size (S|L)$/);
    expect(rows.map((r) => r.props['aria-label'])).toEqual(['Size S', 'Size L']);

    expect(thumbsIn(screen.getByLabelText('Size S, front'))).toEqual(['Front photo of Tester Ana, size S', 'Front photo of Tester Bo, size S']);
    expect(thumbsIn(screen.getByLabelText('Size S, side'))).toEqual([]);
    expect(thumbsIn(screen.getByLabelText('Size S, back'))).toEqual(['Back photo of Tester Ana, size S']);
    expect(thumbsIn(screen.getByLabelText('Size L, side'))).toEqual(['Side photo of Tester Cy, size L']);
    expect(thumbsIn(screen.getByLabelText('Size L, details'))).toEqual(['Detail photo of Tester Cy, size L']);
    // The thumbnails come straight from the signed links the server issued.
    expect(screen.getByLabelText('Back photo of Tester Ana, size S').props.source).toEqual({ uri: 'https://store.example.test/s-back-ana-thumb.jpg?sig=1' });
  });

  it('on a phone shows one size per row, scrolling sideways, each photo named by view and tester', async () => {
    mockedUseIsWide.mockReturnValue(false);
    renderWall();
    const small = await screen.findByLabelText('Size S', undefined, LOAD);
    expect(screen.queryByLabelText('Photos by size and view')).toBeNull();
    expect(within(small).getByText('Size S · 3 photos')).toBeTruthy();
    expect(thumbsIn(small)).toEqual(['Front photo of Tester Ana, size S', 'Front photo of Tester Bo, size S', 'Back photo of Tester Ana, size S']);
    expect(within(small).UNSAFE_getByProps({ horizontal: true })).toBeTruthy();
    expect(thumbsIn(screen.getByLabelText('Size L'))).toEqual(['Side photo of Tester Cy, size L', 'Detail photo of Tester Cy, size L']);
  });

  it('filters by report and by view, asking the server for just those', async () => {
    mockedUseIsWide.mockReturnValue(true);
    renderWall();
    await screen.findByLabelText('Photos by size and view', undefined, LOAD);
    fireEvent.press(within(screen.getByLabelText('Photos from')).getByRole('radio', { name: 'Toile check-in' }));
    await waitFor(() => expect(requested.some((r) => r.url === `${BASE}?stage=check-in`)).toBe(true));
    await waitFor(() => expect(screen.queryByLabelText('Size S')).toBeNull());
    expect(thumbsIn(screen.getByLabelText('Size L, details'))).toEqual(['Detail photo of Tester Cy, size L']);

    fireEvent.press(within(screen.getByLabelText('Photos from')).getByRole('radio', { name: 'Both reports' }));
    fireEvent.press(within(screen.getByLabelText('View')).getByRole('radio', { name: 'Back' }));
    await waitFor(() => expect(requested.some((r) => r.url === `${BASE}?view=back`)).toBe(true));
    await waitFor(() => expect(screen.queryByLabelText('Size L')).toBeNull());
    // One view chosen: one column.
    expect(screen.queryByLabelText('Size S, front')).toBeNull();
    expect(thumbsIn(screen.getByLabelText('Size S, back'))).toEqual(['Back photo of Tester Ana, size S']);

    fireEvent.press(within(screen.getByLabelText('View')).getByRole('radio', { name: 'Side' }));
    fireEvent.press(within(screen.getByLabelText('Photos from')).getByRole('radio', { name: 'Toile check-in' }));
    expect(await screen.findByText(/No photos match yet/, undefined, LOAD)).toBeTruthy();
  });

  it('opens a photo at full size from a fresh link, naming the tester, size and who may see it', async () => {
    mockedUseIsWide.mockReturnValue(true);
    renderWall();
    fireEvent.press(await screen.findByRole('button', { name: /^Open the side photo of Tester Cy, size L\./ }, LOAD));
    const full = await screen.findByLabelText('Side · Tester Cy · size L (Fuller belly), full size', undefined, LOAD);
    expect(full.props.source).toEqual({ uri: 'https://store.example.test/l-side-cy.jpg?sig=full' });
    expect(requested).toContainEqual({ url: '/api/photos/l-side-cy/link', method: 'POST' });
    expect(screen.getByText('Side · Tester Cy · size L (Fuller belly)')).toBeTruthy();
    expect(screen.getByText('Final · draft 2 · The studio may share it')).toBeTruthy();
    fireEvent.press(screen.getByRole('button', { name: 'Close' }));
    await waitFor(() => expect(screen.queryByLabelText(/full size$/)).toBeNull());
  });

  it('says so when no photos are in yet', async () => {
    global.fetch = jest.fn(async () => new Response('[]', { status: 200 })) as jest.Mock;
    renderWall();
    expect(await screen.findByText('No photos match yet. Testers add them to their check-in and final reports.', undefined, LOAD)).toBeTruthy();
  });
});
