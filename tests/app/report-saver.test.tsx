// The report's save engine without a browser: a fake server that answers as the real one does
// (versions, 409 with the current report, 400 naming fields, no connection), and fake timers.
import { ApiError } from '@/hooks/api';
import { ReportSaver, type ReportState, type SaverDeps } from '@/hooks/report-saver';
import type { ReportDraft } from '@/server/domain/schemas/reports';

type Save = { baseVersion: number; changes: Partial<ReportDraft> };

function fakeServer(start: ReportDraft = {}) {
  const server = {
    state: { stage: 'final', content: start, version: 0, submittedAt: null, prefilledFrom: null, prefilled: [], dueAt: null, editable: true } as ReportState,
    saves: [] as Save[],
    submits: [] as number[],
    offline: false,
    refuse: null as Record<string, string> | null,
    /** Answers are held until released, to look at the saver while a save is on its way. */
    hold: false,
    held: [] as (() => void)[],
    /** A change another window makes. */
    elsewhere(changes: Partial<ReportDraft>) {
      server.state = { ...server.state, content: { ...server.state.content, ...changes }, version: server.state.version + 1 };
    },
  };
  const answer = async <T,>(work: () => T): Promise<T> => {
    if (server.hold) await new Promise<void>((resolve) => server.held.push(resolve));
    if (server.offline) throw new ApiError(0, 'offline', 'Basted cannot be reached. Check your connection and try again.');
    return work();
  };
  const store = new Map<string, string>();
  const deps: SaverDeps = {
    send: (body) =>
      answer(() => {
        server.saves.push(body);
        if (server.refuse) throw new ApiError(400, 'invalid_input', 'One answer needs a change.', server.refuse);
        if (body.baseVersion !== server.state.version) throw new ApiError(409, 'stale_report', 'Changed elsewhere.', undefined, { report: server.state });
        server.elsewhere(body.changes);
        return server.state;
      }),
    submit: (version) =>
      answer(() => {
        server.submits.push(version);
        if (version !== server.state.version) throw new ApiError(409, 'stale_report', 'Changed elsewhere.', undefined, { report: server.state });
        server.state = { ...server.state, submittedAt: '2027-03-01T12:00:00.000Z' };
        return server.state;
      }),
    fetch: () => answer(() => server.state),
    store: {
      read: <T,>(key: string) => (store.has(key) ? (JSON.parse(store.get(key)!) as T) : null),
      write: (key, value) => void store.set(key, JSON.stringify(value)),
      remove: (key) => void store.delete(key),
    },
    storeKey: 'unsaved:test',
    delayMs: 600,
    now: () => new Date('2027-03-01T14:02:00Z'),
  };
  return { server, deps, store };
}

/** Lets timers and the promises they start run to the end. */
async function settle(ms = 1000) {
  for (let i = 0; i < 10; i += 1) {
    await jest.advanceTimersByTimeAsync(ms / 10);
  }
}

beforeEach(() => jest.useFakeTimers());
afterEach(() => jest.useRealTimers());

describe('the report save engine', () => {
  it('keeps each change on the device at once, sends after a pause, and says saved only when the server has all of it', async () => {
    const { server, deps, store } = fakeServer();
    const saver = new ReportSaver(deps);
    saver.load(server.state);
    saver.change({ verdict: 'Fits' });
    expect(saver.getView().status).toEqual({ state: 'saving' });
    expect(JSON.parse(store.get('unsaved:test')!)).toEqual({ version: 0, pending: { verdict: 'Fits' } });
    expect(server.saves).toEqual([]);
    await settle();
    expect(server.saves).toEqual([{ baseVersion: 0, changes: { verdict: 'Fits' } }]);
    expect(saver.getView().status).toEqual({ state: 'saved', at: '2027-03-01T14:02:00.000Z', afterOffline: false });
    expect(store.has('unsaved:test')).toBe(false);
  });

  it('sends one save at a time: a change made while a save is on its way goes in the next, on the new version', async () => {
    const { server, deps } = fakeServer();
    const saver = new ReportSaver(deps);
    saver.load(server.state);
    server.hold = true;
    saver.change({ sizeSewn: '12' });
    await settle();
    expect(server.held).toHaveLength(1);
    saver.change({ verdict: 'Typed while the first save was out' });
    await settle();
    // Still one request out: the second waits for the first.
    expect(server.held).toHaveLength(1);
    server.hold = false;
    server.held.shift()!();
    await settle();
    expect(server.saves).toEqual([
      { baseVersion: 0, changes: { sizeSewn: '12' } },
      { baseVersion: 1, changes: { verdict: 'Typed while the first save was out' } },
    ]);
    expect(saver.getView().content).toEqual({ sizeSewn: '12', verdict: 'Typed while the first save was out' });
    expect(saver.getView().status.state).toBe('saved');
  });

  it('a stale save (409) is put on top of the current report and sent again: both windows’ edits survive, and the screen is told', async () => {
    const { server, deps } = fakeServer();
    const saver = new ReportSaver(deps);
    saver.load(server.state);
    server.elsewhere({ verdict: 'From the other window' });
    saver.change({ sizeSewn: '12' });
    await settle();
    expect(server.saves.map((s) => s.baseVersion)).toEqual([0, 1]);
    expect(server.state.content).toEqual({ verdict: 'From the other window', sizeSewn: '12' });
    expect(saver.getView().content).toEqual({ verdict: 'From the other window', sizeSewn: '12' });
    expect(saver.getView().conflict).toEqual({ changedElsewhere: ['verdict'], keptHere: [] });
  });

  it('with no connection the change stays on the device and the status says offline; it is sent when the connection returns', async () => {
    const { server, deps, store } = fakeServer();
    const saver = new ReportSaver(deps);
    saver.load(server.state);
    server.offline = true;
    saver.change({ verdict: 'On the bus' });
    await settle();
    expect(saver.getView().status).toEqual({ state: 'offline' });
    expect(JSON.parse(store.get('unsaved:test')!).pending).toEqual({ verdict: 'On the bus' });
    server.offline = false;
    saver.online();
    await settle();
    expect(server.state.content.verdict).toBe('On the bus');
    expect(saver.getView().status).toEqual({ state: 'saved', at: expect.any(String), afterOffline: true });
  });

  it('a refused save blocks submit with the reason; nothing is submitted', async () => {
    const { server, deps } = fakeServer();
    const saver = new ReportSaver(deps);
    saver.load(server.state);
    server.refuse = { 'changes.alterations.0.amountMm': 'must be at most 50 cm either way' };
    saver.change({ alterations: [{ area: 'leg', kind: 'leg-length', amountMm: 635, where: null, note: '', otherText: '' }] });
    await settle();
    expect(saver.getView().status).toEqual({ state: 'error', message: 'One answer needs a change.', fields: { 'alterations.0.amountMm': 'must be at most 50 cm either way' }, retrying: false });
    await expect(saver.submit()).rejects.toMatchObject({ code: 'unsaved', fields: { 'alterations.0.amountMm': 'must be at most 50 cm either way' } });
    expect(server.submits).toEqual([]);
  });

  it('submit sends the waiting change first, then submits that version', async () => {
    const { server, deps } = fakeServer();
    const saver = new ReportSaver(deps);
    saver.load(server.state);
    saver.change({ verdict: 'Typed just before pressing submit' });
    const done = saver.submit();
    await settle();
    await expect(done).resolves.toMatchObject({ submittedAt: '2027-03-01T12:00:00.000Z', content: { verdict: 'Typed just before pressing submit' } });
    expect(server.submits).toEqual([1]);
  });

  it('when the answer to a submission is lost, the server is asked what it holds', async () => {
    const { server, deps } = fakeServer({ verdict: 'Done' });
    const lostAnswer: SaverDeps = {
      ...deps,
      submit: async (version) => {
        await deps.submit(version);
        throw new ApiError(0, 'offline', 'Basted cannot be reached.');
      },
    };
    const saver = new ReportSaver(lostAnswer);
    saver.load(server.state);
    const done = saver.submit();
    await settle();
    await expect(done).resolves.toMatchObject({ submittedAt: '2027-03-01T12:00:00.000Z' });
  });

  it('changes left on the device by an earlier visit come back and are sent; what the server already has is not resent', async () => {
    const { server, deps, store } = fakeServer({ sizeSewn: '12' });
    store.set('unsaved:test', JSON.stringify({ version: 0, pending: { sizeSewn: '12', verdict: 'Typed just before the reload' } }));
    const saver = new ReportSaver(deps);
    saver.load(server.state);
    expect(saver.getView().restored).toBe(true);
    expect(saver.getView().content).toEqual({ sizeSewn: '12', verdict: 'Typed just before the reload' });
    await settle();
    expect(server.saves).toEqual([{ baseVersion: 0, changes: { verdict: 'Typed just before the reload' } }]);
  });

  it('leaving the page sends what is unsaved in a request that outlives the page', async () => {
    const { server, deps } = fakeServer();
    const send = jest.fn(deps.send);
    const saver = new ReportSaver({ ...deps, send });
    saver.load(server.state);
    saver.change({ verdict: 'Typed, then the tab was closed' });
    saver.leave();
    expect(send).toHaveBeenCalledWith({ baseVersion: 0, changes: { verdict: 'Typed, then the tab was closed' } }, { keepalive: true });
  });
});
