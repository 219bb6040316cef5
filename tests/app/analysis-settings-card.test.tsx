// The owner's thresholds of the findings: what is sent, what comes back named by field, and what a
// grader sees. Defaults from server/analysis/thresholds.ts.
import { fireEvent, render, screen, waitFor } from '@testing-library/react-native';
import { SWRConfig } from 'swr';
import { AnalysisSettingsCard } from '@/components/studio/analysis-settings-card';
import { fetcher } from '@/hooks/api';

type Call = { url: string; method: string; body: unknown };

function serve(analysis: Record<string, number>, patchAnswer?: (body: { settings: { analysis: Record<string, number | null> } }) => Response) {
  const calls: Call[] = [];
  const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
  global.fetch = jest.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = String(input);
    const method = init?.method ?? 'GET';
    const body = init?.body ? JSON.parse(String(init.body)) : undefined;
    calls.push({ url, method, body });
    if (method === 'PATCH') return patchAnswer ? patchAnswer(body) : json({ id: 's1', settings: { analysis: { ...analysis, ...body.settings.analysis } } });
    return json({ id: 's1', settings: { fullerBellyMarginMm: 25.4, analysis } });
  }) as typeof fetch;
  return calls;
}

const wrap = (ui: React.ReactElement) => render(<SWRConfig value={{ provider: () => new Map(), fetcher, dedupingInterval: 0 }}>{ui}</SWRConfig>);

describe('AnalysisSettingsCard', () => {
  it('shows the studio’s own value, the default as a hint, and sends only what changed', async () => {
    const calls = serve({ draftWideMinLowerBound: 0.3 });
    wrap(<AnalysisSettingsCard studioId="s1" canEdit />);
    const bound = await screen.findByLabelText('Whole draft: rate to exceed');
    expect(bound.props.value).toBe('0.3');
    expect(screen.getByText(/shown to be above this.*Default 0.25\./)).toBeTruthy();
    fireEvent.changeText(screen.getByLabelText('Error level'), '0.01');
    fireEvent.changeText(bound, '');
    fireEvent.press(screen.getByRole('button', { name: 'Save thresholds' }));
    await screen.findByText(/Thresholds saved/);
    const patch = calls.find((c) => c.method === 'PATCH')!;
    expect(patch.url).toBe('/api/studios/s1');
    expect(patch.body).toEqual({ settings: { analysis: { alpha: 0.01, draftWideMinLowerBound: null } } });
  });

  it('names a threshold the server refuses, and one that is not a number without sending anything', async () => {
    const calls = serve({}, () =>
      new Response(JSON.stringify({ error: { code: 'invalid_input', message: 'Some fields need attention.', fields: { 'settings.analysis.alpha': 'must be at most 0.2' } } }), { status: 400, headers: { 'Content-Type': 'application/json' } }),
    );
    wrap(<AnalysisSettingsCard studioId="s1" canEdit />);
    fireEvent.changeText(await screen.findByLabelText('Fewest testers for findings'), 'three');
    fireEvent.press(screen.getByRole('button', { name: 'Save thresholds' }));
    await screen.findByText(/must be a number/);
    expect(calls.some((c) => c.method === 'PATCH')).toBe(false);

    fireEvent.changeText(screen.getByLabelText('Fewest testers for findings'), '');
    fireEvent.changeText(screen.getByLabelText('Error level'), '0.5');
    fireEvent.press(screen.getByRole('button', { name: 'Save thresholds' }));
    await screen.findByText(/must be at most 0.2/);
  });

  it('is read-only for staff who are not the owner', async () => {
    serve({ alpha: 0.01 });
    wrap(<AnalysisSettingsCard studioId="s1" canEdit={false} />);
    const alpha = await screen.findByLabelText('Error level');
    await waitFor(() => expect(alpha.props.value).toBe('0.01'));
    expect(alpha.props.editable).toBe(false);
    expect(screen.queryByRole('button', { name: 'Save thresholds' })).toBeNull();
  });
});
