import { fireEvent, render, screen, waitFor } from '@testing-library/react-native';
import { SWRConfig } from 'swr';
import { OutboxPanel } from '@/components/mail/outbox-panel';
import { fetcher } from '@/hooks/api';

const BASE = '/api/studios/s1/trials/t1/mail';
const failed = {
  id: 'm1',
  to: { name: 'Tester One', email: 'one@example.test' },
  template: 'reminder-1d',
  category: 'reminders',
  subject: 'Due tomorrow: final report, Wide-leg trousers',
  status: 'failed',
  attempts: 5,
  lastError: 'connect ECONNREFUSED 127.0.0.1:1025',
  providerMessageId: null,
  nextAttemptAt: null,
  sentAt: null,
  createdAt: '2026-12-09T08:05:00Z',
  canResend: true,
};
const sent = { ...failed, id: 'm2', to: { name: 'Tester Two', email: 'two@example.test' }, subject: 'Due tomorrow (two)', status: 'sent', attempts: 1, lastError: null, sentAt: '2026-12-09T08:05:00Z', canResend: false };

function setup() {
  const calls: { url: string; method: string }[] = [];
  let resent = false;
  const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status });
  global.fetch = jest.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = String(input);
    const method = init?.method ?? 'GET';
    calls.push({ url, method });
    if (url === BASE && method === 'GET') {
      return json({
        messages: [resent ? { ...failed, status: 'sent', attempts: 1, lastError: null, sentAt: '2026-12-09T09:00:00Z', canResend: false } : failed, sent],
        upcoming: [{ tester: 'Tester Three', what: 'final report', stage: 'day', sendAt: '2026-12-10T08:00:00Z', timeZone: 'UTC', turnedOff: false }],
      });
    }
    if (url === `${BASE}/m1/resend` && method === 'POST') {
      resent = true;
      return json({ ...failed, status: 'sent', attempts: 1, canResend: false });
    }
    return json({ error: { code: 'not_found', message: 'No such thing.' } }, 404);
  }) as jest.Mock;
  render(
    <SWRConfig value={{ provider: () => new Map(), fetcher, dedupingInterval: 0 }}>
      <OutboxPanel studioId="s1" trialId="t1" timeZone="UTC" />
    </SWRConfig>,
  );
  return calls;
}

describe('the Mail panel of a trial', () => {
  it('shows each message with its status and the reason of a failure, and the reminders ahead', async () => {
    setup();
    expect(await screen.findByText('Due tomorrow: final report, Wide-leg trousers')).toBeTruthy();
    expect(screen.getByText(/^Not delivered · 5 attempts/)).toBeTruthy();
    expect(screen.getByText('Reason: connect ECONNREFUSED 127.0.0.1:1025')).toBeTruthy();
    expect(screen.getByText(/^Sent ·/)).toBeTruthy();
    expect(screen.getByText(/Tester Three · final report, due today/)).toBeTruthy();
    // Only the failed message offers a resend.
    expect(screen.getAllByRole('button', { name: /^Send again/ })).toHaveLength(1);
  });

  it('sends a failed message again and shows the outcome', async () => {
    const calls = setup();
    fireEvent.press(await screen.findByRole('button', { name: 'Send again: Due tomorrow: final report, Wide-leg trousers to one@example.test' }));
    expect(await screen.findByText('Sent again to one@example.test.')).toBeTruthy();
    expect(calls).toContainEqual({ url: `${BASE}/m1/resend`, method: 'POST' });
    await waitFor(() => expect(screen.queryByRole('button', { name: /^Send again/ })).toBeNull());
  });
});
