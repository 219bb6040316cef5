// The findings screen of one trial, driven through the router with the API answered by a fake
// fetch: filters, the draft comparison, triage and notes, and the empty and error states.
import { fireEvent, screen, waitFor, within } from '@testing-library/react-native';
import { renderRouter } from 'expo-router/testing-library';
import type { ReactNode } from 'react';
import { SWRConfig } from 'swr';
import StudioLayout from '@/app/(studio)/_layout';
import FindingsIndex from '@/app/(studio)/findings';
import TrialFindingsScreen from '@/app/(studio)/findings/[trialId]';
import { fetcher } from '@/hooks/api';
import type { ComparisonRow, Finding, FindingClass, SizeStats } from '@/server/analysis/types';
import type { Role } from '@/server/domain/roles';

jest.mock('@/hooks/use-is-wide', () => ({ useIsWide: jest.fn(() => false) }));

const SIZES = ['8', '10', '12', '14'];
const BASE = '/api/studios/s1/trials/t1/findings';

function bySize(counts: [number, number][]): SizeStats[] {
  return counts.map(([k, n], i) => ({
    size: SIZES[i]!,
    n,
    k,
    rate: n ? k / n : null,
    wilson: n ? [0, 1] : null,
    meanMm: k ? 20 + 5 * i : null,
    medianMm: k ? 20 + 5 * i : null,
    sdMm: null,
    fisherP: null,
    holmP: null,
  }));
}

function finding(kind: string, direction: 'add' | 'remove', cls: FindingClass, count: number, extra: Partial<Finding> = {}): Finding {
  return {
    kind,
    direction,
    class: cls,
    testers: 10,
    count,
    rate: count / 10,
    wilson: [0.2, 0.8],
    meanMm: 25,
    medianMm: 25,
    sdMm: 3,
    directionShare: 1,
    bySize: bySize([
      [1, 2],
      [2, 3],
      [0, 0],
      [count > 3 ? 3 : 0, 5],
    ]),
    makerSizes: 2,
    rateAbove: { rate: 0.25, p: 0.4 },
    trend: { z: 1, p: 0.3 },
    amountSlope: null,
    sizeTrend: null,
    bodyCorrelation: null,
    sizes: [],
    tests: [],
    family: { size: 6, kindP: 0.01, chosen: true, level: 0.05, kindsTested: 4, kindsChosen: 4 },
    reasons: [`Reason for ${kind}.`],
    ...extra,
  };
}

const FINDINGS = [
  finding('leg-length', 'add', 'draft-wide', 6, { amountSlope: { slopeMmPerSize: 5, interceptMm: 20, p: 0.02, n: 6, sizes: 3 } }),
  finding('waist', 'remove', 'grading', 4),
  finding('hip', 'add', 'personal-fit', 3),
  finding('swayback', 'add', 'too-few-reports', 1),
];

const COMPARISON: ComparisonRow[] = [
  { kind: 'leg-length', direction: 'add', class: 'draft-wide', from: '1', to: '2', status: 'fixed', p: 0.004, pExact: '1/250', difference: { estimate: -0.49, interval: [-0.74, -0.11] }, sizes: [], countFrom: 6, testersFrom: 10, countTo: 1, testersTo: 9, reasons: ['Rate fell.'] },
  { kind: 'waist', direction: 'remove', class: 'grading', from: '1', to: '2', status: 'improved', p: 0.05, pExact: '1/20', difference: { estimate: -0.18, interval: [-0.55, 0.25] }, sizes: [], countFrom: 4, testersFrom: 10, countTo: 2, testersTo: 9, reasons: ['Rate fell a little.'] },
  { kind: 'hip', direction: 'add', class: 'personal-fit', from: '1', to: '2', status: 'personal-fit', p: null, pExact: null, difference: null, sizes: [], countFrom: 3, testersFrom: 10, countTo: 0, testersTo: 2, reasons: ['Personal fit.'] },
];
const CHANGES = ['8', '10', '12', '14'].map((size) => ({
  kind: 'leg-length', direction: 'add' as const, class: 'draft-wide' as const, size, amountMm: 25, interval: [19, 32] as [number, number], basis: 'median' as const, extrapolated: false,
  note: 'The same change at every size.',
}));

const FIT = [
  { size: '12', area: 'waist', n: 3, mean: 1.67, sd: 0.58, interval: [0.23, 2], p: 0.25, adjustedP: 1, flagged: false, hint: true, reasons: ['Waist rated loose in size 12, not confirmed.'] },
  { size: '8', area: 'waist', n: 2, mean: 0, sd: 0, interval: [0, 0], p: 1, adjustedP: 1, flagged: false, hint: false, reasons: [] },
];
const FIT_AREAS = [
  { area: 'rise', n: 10, mean: -1.2, interval: [-1.6, -0.8], whole: { p: 0.002, adjustedP: 0.008 }, withSize: null, flag: 'whole-range', reasons: ['Rise too short across the range.'] },
  { area: 'waist', n: 5, mean: 0.6, interval: [-0.4, 1.6], whole: { p: 0.4, adjustedP: 1 }, withSize: null, flag: null, reasons: [] },
];
const FABRIC = [
  { size: '14', widthMm: 1500, napped: false, needMm: 2000, n: 4, medianUsedMm: 2286, maxUsedMm: 2500, overNeed: 3, overNeedShare: 0.75, flagged: true, reasons: ['Ran short.'] },
  { size: '8', widthMm: 1500, napped: true, needMm: 2000, n: 2, medianUsedMm: 1800, maxUsedMm: 1900, overNeed: 0, overNeedShare: 0, flagged: false, reasons: [] },
];
const STEPS = [{ step: 'Step 4: set the fly', count: 3, testers: ['a', 'b', 'c'], flagged: true }];

type Call = { url: string; method: string; body: unknown };

/** Serves a session in the given role, the trial, and findings; records every request. */
function serve({ role = 'owner' as Role, result = 'full' as 'full' | 'none' | 'fail' | 'missing', extras = false } = {}) {
  const calls: Call[] = [];
  // Like the server, the saved triage comes back with the findings when they are fetched again.
  const triage = new Map<string, unknown>();
  const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status });
  global.fetch = jest.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = String(input);
    const method = init?.method ?? 'GET';
    const body = init?.body ? JSON.parse(String(init.body)) : undefined;
    calls.push({ url, method, body });
    if (url === '/api/auth/session') {
      const studio = { id: 's1', name: 'Test Studio', slug: 'test', timeZone: 'UTC', role };
      return json({ user: { id: 'u1', email: 'me@example.test', name: 'Me', lengthUnit: 'cm', fabricUnit: 'm' }, studios: [studio], currentStudioId: 's1' });
    }
    if (url === '/api/studios/s1') return json({ id: 's1', name: 'Test Studio', settings: {} });
    if (url === '/api/studios/s1/trials') return json([{ id: 't1', title: 'Wide-leg trousers', state: 'running', pattern: { name: 'Wide-leg' }, milestones: [] }]);
    if (url === '/api/studios/s1/trials/t1') return json({ id: 't1', title: 'Wide-leg trousers', state: 'running', pattern: null, milestones: [] });
    if (url === `${BASE}/triage` && method === 'PUT') {
      const b = body as { kind: string; direction: string; state: string; fixedInDraft?: number };
      const saved = { state: b.state, fixedInDraft: b.fixedInDraft ?? null, updatedAt: '2026-12-01T10:00:00Z', updatedBy: { id: 'u1', name: 'Me' } };
      triage.set(`${b.kind}|${b.direction}`, saved);
      return json({ triage: saved, notes: [] });
    }
    if (url === `${BASE}/notes` && method === 'POST') {
      return json({ triage: { state: 'open', fixedInDraft: null }, notes: [{ id: 'n1', author: { id: 'u1', name: 'Me' }, body: (body as { body: string }).body, createdAt: '2026-12-01T10:00:00Z' }] });
    }
    if (url.startsWith(BASE)) {
      if (result === 'missing') return json({ error: { code: 'not_found', message: 'There is no such trial.' } }, 404);
      if (result === 'fail') return json({ error: { code: 'internal', message: 'Something broke.' } }, 500);
      if (result === 'none') return json({ input: { testers: 0 }, result: null });
      const compare = url.includes('compare=1,2');
      const draft = /draft=(\d+)/.exec(url)?.[1] ?? '2';
      return json({
        input: { testers: 19 },
        result: {
          draft,
          drafts: ['1', '2'],
          testers: 10,
          findings: FINDINGS.map((f) => ({ ...f, ...(triage.has(`${f.kind}|${f.direction}`) ? { triage: triage.get(`${f.kind}|${f.direction}`) } : {}) })),
          ...(compare ? { comparison: COMPARISON } : {}),
          changes: extras ? CHANGES : [],
          ...(extras ? { fitRatings: FIT, fitAreas: FIT_AREAS, fabric: FABRIC, unclearSteps: STEPS } : {}),
        },
      });
    }
    return json([]);
  }) as jest.Mock;
  return calls;
}

function Fresh({ children }: { children: ReactNode }) {
  return <SWRConfig value={{ provider: () => new Map(), fetcher, dedupingInterval: 0 }}>{children}</SWRConfig>;
}

const routes = {
  '(studio)/_layout': () => (
    <Fresh>
      <StudioLayout />
    </Fresh>
  ),
  '(studio)/findings/index': FindingsIndex,
  '(studio)/findings/[trialId]': TrialFindingsScreen,
  '(studio)/trials/[id]': () => null,
  '(auth)/sign-in': () => null,
};

const row = (key: string) => screen.queryByTestId(`finding-${key}`);

describe('the findings screen of a trial', () => {
  it('lists the findings with our class names, counts and intervals, and filters them by class', async () => {
    serve();
    renderRouter(routes, { initialUrl: '/findings/t1' });
    expect(await screen.findByRole('heading', { name: 'Findings: Wide-leg trousers' })).toBeTruthy();
    for (const key of ['leg-length|add', 'waist|remove', 'hip|add', 'swayback|add']) expect(row(key)).toBeTruthy();
    const leg = within(row('leg-length|add')!);
    expect(leg.getByText('! Whole draft')).toBeTruthy();
    expect(leg.getByText('6 of 10 testers')).toBeTruthy();
    expect(leg.getByText('60% (95% 20–80%)')).toBeTruthy();
    expect(leg.getByText('Reason for leg-length.')).toBeTruthy();
    expect(within(row('waist|remove')!).getByText('! Grading')).toBeTruthy();
    expect(within(row('hip|add')!).getByText('Personal fit')).toBeTruthy();
    expect(within(row('swayback|add')!).getByText('Too few to judge')).toBeTruthy();

    fireEvent.press(screen.getByRole('checkbox', { name: 'Grading (1)' }));
    fireEvent.press(screen.getByRole('checkbox', { name: 'Too few to judge (1)' }));
    await waitFor(() => expect(row('waist|remove')).toBeNull());
    expect(row('swayback|add')).toBeNull();
    expect(row('leg-length|add')).toBeTruthy();
    expect(row('hip|add')).toBeTruthy();
    // The heat grid follows the filter: the hidden rows have no cells.
    expect(screen.queryByTestId('heat-cell-waist|remove-8')).toBeNull();
    expect(screen.getByTestId('heat-cell-leg-length|add-10')).toHaveTextContent('2/3');

    fireEvent.press(screen.getByRole('checkbox', { name: 'Grading (1)' }));
    await waitFor(() => expect(row('waist|remove')).toBeTruthy());
  });

  it('opens a finding onto its reasons and both charts', async () => {
    serve();
    renderRouter(routes, { initialUrl: '/findings/t1' });
    fireEvent.press(await screen.findByRole('button', { name: /^Leg length, added: Whole draft, 6 of 10 testers, 60%/ }));
    expect(await screen.findByText('• Reason for leg-length.')).toBeTruthy();
    expect(screen.getByTestId('rate-chart')).toBeTruthy();
    expect(screen.getByTestId('amount-chart')).toBeTruthy();
    expect(screen.getByLabelText(/The fitted line changes by 0\.5 cm per size step/)).toBeTruthy();
  });

  it('asks for another draft and compares two drafts, showing each finding’s status', async () => {
    const calls = serve();
    renderRouter(routes, { initialUrl: '/findings/t1' });
    await screen.findByText('Findings of draft 2');
    const draftGroup = screen.getByLabelText('Draft');
    fireEvent.press(within(draftGroup).getByRole('radio', { name: 'Draft 1' }));
    expect(await screen.findByText('Findings of draft 1')).toBeTruthy();
    expect(calls.some((c) => c.url === `${BASE}?draft=1`)).toBe(true);

    fireEvent.press(within(draftGroup).getByRole('radio', { name: 'Draft 2' }));
    await screen.findByText('Findings of draft 2');
    fireEvent.press(screen.getByRole('button', { name: 'Compare the drafts' }));
    const list = await screen.findByTestId('comparison');
    expect(calls.some((c) => c.url === `${BASE}?draft=2&compare=1,2`)).toBe(true);
    expect(within(screen.getByTestId('comparison-leg-length|add')).getByText('✓ Fixed')).toBeTruthy();
    expect(within(screen.getByTestId('comparison-waist|remove')).getByText('↘ Improved, not confirmed')).toBeTruthy();
    expect(within(screen.getByTestId('comparison-hip|add')).getByText('– Personal fit, nothing to fix')).toBeTruthy();
    expect(within(list).getByText(/draft 1: 6 of 10 → draft 2: 1 of 9 · change −49 points \(95% −74 to −11\) · p = 0\.004 \(1\/250\)/)).toBeTruthy();
    expect(within(list).getByText(/draft 1: 4 of 10 → draft 2: 2 of 9 · change −18 points \(95% −55 to \+25\) · p = 0\.050 \(1\/20\)/)).toBeTruthy();
    expect(within(list).getByText(/no test/)).toBeTruthy();
  });

  it('keeps the chosen draft in the address, and opens the draft the address names', async () => {
    const calls = serve();
    const view = renderRouter(routes, { initialUrl: '/findings/t1?draft=1' });
    expect(await screen.findByText('Findings of draft 1')).toBeTruthy();
    expect(calls.some((c) => c.url === `${BASE}?draft=1`)).toBe(true);
    expect(calls.some((c) => c.url === BASE)).toBe(false);
    fireEvent.press(within(screen.getByLabelText('Draft')).getByRole('radio', { name: 'Draft 2' }));
    await screen.findByText('Findings of draft 2');
    await waitFor(() => expect(view.getSearchParams()).toEqual({ trialId: 't1', draft: '2' }));
  });

  it('sends the triage change with the finding’s kind and direction, and shows the saved state', async () => {
    const calls = serve({ role: 'grader' });
    renderRouter(routes, { initialUrl: '/findings/t1' });
    fireEvent.press(await screen.findByRole('button', { name: /^Leg length, added: Whole draft, 6 of 10 testers, 60%/ }));
    const triage = await screen.findByLabelText('Triage of Leg length, added');
    fireEvent.press(within(triage).getByRole('radio', { name: 'Will fix' }));
    fireEvent.press(screen.getByRole('button', { name: 'Save the triage' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'PUT')).toHaveLength(1));
    expect(calls.find((c) => c.method === 'PUT')).toEqual({ url: `${BASE}/triage`, method: 'PUT', body: { kind: 'leg-length', direction: 'add', state: 'will-fix' } });
    expect(await screen.findByText(/^Triage: Will fix · Me/)).toBeTruthy();
    // The findings are fetched again, so the change table can follow the new triage.
    await waitFor(() => expect(calls.filter((c) => c.method === 'GET' && c.url === BASE).length).toBeGreaterThanOrEqual(2));

    fireEvent.press(within(screen.getByLabelText('Triage of Leg length, added')).getByRole('radio', { name: 'Fixed in a draft' }));
    const fixedIn = screen.getByLabelText('Fixed in draft');
    fireEvent.press(within(fixedIn).getByRole('radio', { name: 'Draft 1' }));
    fireEvent.press(screen.getByRole('button', { name: 'Save the triage' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'PUT')).toHaveLength(2));
    expect(calls.filter((c) => c.method === 'PUT')[1]!.body).toEqual({ kind: 'leg-length', direction: 'add', state: 'fixed', fixedInDraft: 1 });
    expect(await screen.findByText(/^Triage: Fixed in draft 1/)).toBeTruthy();
  });

  it('adds a note and lists it; refuses an empty note without a request', async () => {
    const calls = serve();
    renderRouter(routes, { initialUrl: '/findings/t1' });
    fireEvent.press(await screen.findByRole('button', { name: /^Waist larger or smaller, taken out: Grading/ }));
    fireEvent.press(await screen.findByRole('button', { name: 'Add the note' }));
    expect(await screen.findByText('Note on Waist larger or smaller, taken out: write something first')).toBeTruthy();
    fireEvent.changeText(screen.getByLabelText('Note on Waist larger or smaller, taken out'), '  Check the grade at the side seam.  ');
    fireEvent.press(screen.getByRole('button', { name: 'Add the note' }));
    expect(await screen.findByText('Check the grade at the side seam.')).toBeTruthy();
    expect(calls.filter((c) => c.method === 'POST')).toEqual([
      { url: `${BASE}/notes`, method: 'POST', body: { kind: 'waist', direction: 'remove', body: 'Check the grade at the side seam.' } },
    ]);
    expect(screen.getByText('Notes (1)')).toBeTruthy();
  });

  it('shows the fit ratings, fabric and instruction checks when the reports carry them, flagged ones marked', async () => {
    serve({ extras: true });
    renderRouter(routes, { initialUrl: '/findings/t1' });
    expect(await screen.findByText('Fit ratings by size and area')).toBeTruthy();
    // The area off across the range is flagged; a single size off on average is a hint.
    expect(screen.getByText('! rise: too tight or short across the range (mean −1.2, 10 ratings)')).toBeTruthy();
    expect(screen.getByText('? Size 12, waist: +1.7 (too loose or long), 3 ratings')).toBeTruthy();
    expect(screen.getByLabelText('Size 12, waist: +1.7 from 3 ratings, a hint, not confirmed')).toBeTruthy();
    expect(screen.getByLabelText('Size 8, waist: 0.0 from 2 ratings')).toBeTruthy();
    // Fabric in the viewer's metres: only the size that ran over until every size is asked for.
    expect(screen.getByText('! Size 14, 150 cm wide')).toBeTruthy();
    expect(screen.getByText('Stated need 2.00 m · median used 2.29 m · most used 2.50 m · 3 of 4 used more than stated')).toBeTruthy();
    expect(screen.queryByText('Size 8, 150 cm wide, one-way layout')).toBeNull();
    fireEvent.press(screen.getByRole('button', { name: 'Show every size and width (2)' }));
    expect(await screen.findByText('Size 8, 150 cm wide, one-way layout')).toBeTruthy();
    expect(screen.getByText('! Step 4: set the fly')).toBeTruthy();
    expect(screen.getByText('3 testers found it unclear: rewrite it')).toBeTruthy();
  });

  it('lists the changes for the next draft per size, in the reader’s unit, for the findings marked “will fix”', async () => {
    serve({ extras: true });
    renderRouter(routes, { initialUrl: '/findings/t1' });
    expect(await screen.findByText('Changes for the next draft (from draft 2)')).toBeTruthy();
    const table = within(screen.getByTestId('changes-leg-length|add'));
    expect(table.getByText('Leg length, added · Whole draft')).toBeTruthy();
    expect(table.getAllByText('2.5 cm')).toHaveLength(4);
    expect(table.getAllByText('1.9 cm to 3.2 cm')).toHaveLength(4);
    expect(screen.getByRole('button', { name: 'Download the changes as CSV' })).toBeTruthy();
  });

  it('says how to fill the change table when nothing is marked “will fix”', async () => {
    serve();
    renderRouter(routes, { initialUrl: '/findings/t1' });
    expect(await screen.findByText(/No finding is marked “Will fix” yet/)).toBeTruthy();
  });

  it('leaves out the checks the reports do not carry', async () => {
    serve();
    renderRouter(routes, { initialUrl: '/findings/t1' });
    await screen.findByText('Findings of draft 2');
    expect(screen.queryByText('Fit ratings by size and area')).toBeNull();
    expect(screen.queryByText('Fabric used against the stated need')).toBeNull();
    expect(screen.queryByText('Unclear instruction steps')).toBeNull();
  });

  it('says so when no report is submitted yet', async () => {
    serve({ result: 'none' });
    renderRouter(routes, { initialUrl: '/findings/t1' });
    expect(await screen.findByText(/No submitted reports yet/)).toBeTruthy();
  });

  it('says so when the trial is not in this studio', async () => {
    serve({ result: 'missing' });
    renderRouter(routes, { initialUrl: '/findings/t1' });
    expect(await screen.findByText('There is no such trial in this studio.')).toBeTruthy();
  });

  it('shows the error with a way to try again', async () => {
    serve({ result: 'fail' });
    renderRouter(routes, { initialUrl: '/findings/t1' });
    expect(await screen.findByText('Could not load this: Something broke.')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
  });
});

describe('the findings section', () => {
  it('lists the studio’s trials, each linking to its findings', async () => {
    serve();
    const router = renderRouter(routes, { initialUrl: '/findings' });
    fireEvent.press(await screen.findByRole('link', { name: /Wide-leg trousers/ }));
    await waitFor(() => expect(router.getPathname()).toBe('/findings/t1'));
    expect(await screen.findByRole('heading', { name: 'Findings: Wide-leg trousers' })).toBeTruthy();
  });
});
