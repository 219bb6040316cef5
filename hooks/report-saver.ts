import type { ReportDraft, ReportPart } from '@/server/domain/schemas/reports';
import { ApiError } from './api';

export type ReportChoices = { sizes: string[]; chosenSize: string | null; variants: string[]; drafts: { version: number; changeNote: string; createdAt: string }[] };
export type ReportState = {
  stage: 'check-in' | 'final';
  content: ReportDraft;
  /** What the next save must name: the server refuses a save made on an older version. */
  version: number;
  submittedAt: string | null;
  /** A final report started from the check-in's answers on these parts. */
  prefilledFrom: 'check-in' | null;
  prefilled: ReportPart[];
  dueAt: string | null;
  editable: boolean;
  choices?: ReportChoices;
};

export type SaveStatus =
  /** Nothing changed since the report was opened. */
  | { state: 'idle' }
  /** Changes are waiting for their turn or on their way to the server. */
  | { state: 'saving' }
  /** The server has every change; `at` is when it confirmed the last one. */
  | { state: 'saved'; at: string; afterOffline: boolean }
  /** No connection: the changes are kept on this device and sent when it returns. */
  | { state: 'offline' }
  /** The server refused or failed; the changes are kept on this device. */
  | { state: 'error'; message: string; fields?: Record<string, string>; retrying: boolean };

export type SaverView = {
  /** The report as the server last confirmed it (null until first loaded). */
  report: ReportState | null;
  /** What the screen shows: the confirmed report with the changes not yet confirmed on top. */
  content: ReportDraft;
  status: SaveStatus;
  /** Parts changed here and not yet confirmed by the server. */
  unsaved: ReportPart[];
  /** Unsaved changes from an earlier visit on this device were found and are being sent. */
  restored: boolean;
  /** The report was also changed elsewhere (another window or device) while this one had changes. */
  conflict: { changedElsewhere: ReportPart[]; keptHere: ReportPart[] } | null;
};

type Stored = { version: number; pending: Partial<ReportDraft> };
type SaveBody = { baseVersion: number; changes: Partial<ReportDraft> };

export type SaverDeps = {
  send(body: SaveBody, options: { keepalive: boolean }): Promise<ReportState>;
  submit(version: number): Promise<ReportState>;
  fetch(): Promise<ReportState>;
  store: { read<T>(key: string): T | null; write(key: string, value: unknown): void; remove(key: string): void };
  storeKey: string;
  /** Told of every state the server confirmed (to keep the data cache in step). */
  onConfirmed?(state: ReportState): void;
  /** The pause after the last change before it is sent. */
  delayMs?: number;
  now?(): Date;
};

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);
const partsOf = (changes: Partial<ReportDraft>) => Object.keys(changes) as ReportPart[];
/** A stale save is put on top of the current report and sent again; this many times in a row at most. */
const MAX_REBASES = 5;
const RETRY_MS = [2_000, 5_000, 10_000, 30_000];

/**
 * Saves one report as the tester works, without losing or inventing anything:
 * - every change is written to this device at once (a reload or a closed tab keeps it) and sent
 *   after a short pause; saves of one report go one at a time, each naming the version it was
 *   made on;
 * - a save the server finds stale (409: changed in another window) is put on top of the report
 *   as it now is and sent again, so both windows' changes survive;
 * - the status is what the server said: "saved" only once it has every change; a lost connection
 *   or a refusal keeps the changes here and says so;
 * - submitting first sends every change, and goes ahead only when the server took them all.
 */
export class ReportSaver {
  private base: ReportState | null = null;
  private pending: Partial<ReportDraft> = {};
  private timer: ReturnType<typeof setTimeout> | null = null;
  private retryTimer: ReturnType<typeof setTimeout> | null = null;
  private retries = 0;
  private running: Promise<void> | null = null;
  private wasOffline = false;
  private listeners = new Set<() => void>();
  private view: SaverView = { report: null, content: {}, status: { state: 'idle' }, unsaved: [], restored: false, conflict: null };

  constructor(private readonly deps: SaverDeps) {}

  subscribe = (listener: () => void) => {
    this.listeners.add(listener);
    return () => {
      this.listeners.delete(listener);
    };
  };

  getView = () => this.view;

  private update(patch: Partial<SaverView>) {
    const report = this.base;
    this.view = { ...this.view, ...patch, report, content: { ...(report?.content ?? {}), ...this.pending }, unsaved: partsOf(this.pending) };
    for (const listener of this.listeners) listener();
  }

  private persist() {
    if (partsOf(this.pending).length === 0) this.deps.store.remove(this.deps.storeKey);
    else this.deps.store.write(this.deps.storeKey, { version: this.base?.version ?? 0, pending: this.pending } satisfies Stored);
  }

  private now() {
    return this.deps.now?.() ?? new Date();
  }

  /**
   * The report as the server sent it (first load, a revalidation, a 409). An older or equal
   * version than the one held changes nothing. The first load also brings back the changes this
   * device still holds from an earlier visit.
   */
  load(state: ReportState) {
    const first = this.base === null;
    if (!first && state.version < this.base!.version) return;
    if (!first && state.version === this.base!.version && same(state, this.base)) return;
    if (first) {
      const stored = this.deps.store.read<Stored>(this.deps.storeKey);
      this.base = state;
      if (stored && Object.keys(stored.pending ?? {}).length) {
        // What the server already has (e.g. sent by the keepalive request as the page closed) is not news.
        for (const part of partsOf(stored.pending)) if (!same(stored.pending[part], state.content[part])) (this.pending as Record<string, unknown>)[part] = stored.pending[part];
        this.persist();
        if (partsOf(this.pending).length) {
          this.update({ restored: true, status: { state: 'saving' } });
          void this.run();
          return;
        }
      }
      this.update({});
      return;
    }
    this.rebase(state);
    this.update({});
  }

  /** Takes the server's newer report as the base, keeping this window's unsaved changes on top. */
  private rebase(current: ReportState) {
    const old = this.base;
    const hadChanges = partsOf(this.pending).length > 0;
    const changedElsewhere = old ? (Object.keys({ ...old.content, ...current.content }) as ReportPart[]).filter((p) => !same(old.content[p], current.content[p])) : [];
    const keptHere = changedElsewhere.filter((p) => p in this.pending && !same(this.pending[p], current.content[p]));
    this.base = current;
    for (const part of partsOf(this.pending)) if (same(this.pending[part], current.content[part])) delete this.pending[part];
    this.persist();
    // Only news when this window had changes of its own: otherwise the screen simply shows the newer report.
    if (hadChanges && changedElsewhere.length) this.view = { ...this.view, conflict: { changedElsewhere, keptHere } };
  }

  /** A change made by the tester: on this device at once, sent after a short pause. */
  change(parts: Partial<ReportDraft>) {
    this.pending = { ...this.pending, ...parts };
    this.persist();
    this.update({ status: { state: 'saving' } });
    this.schedule(this.deps.delayMs ?? 600);
  }

  private schedule(ms: number) {
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = null;
      void this.run();
    }, ms);
  }

  private scheduleRetry() {
    if (this.retryTimer) clearTimeout(this.retryTimer);
    const ms = RETRY_MS[Math.min(this.retries, RETRY_MS.length - 1)];
    this.retries += 1;
    this.retryTimer = setTimeout(() => {
      this.retryTimer = null;
      void this.run();
    }, ms);
  }

  /** Sends what is unsaved, one save at a time, until the server has it all or refuses. */
  private run(options: { keepalive: boolean } = { keepalive: false }): Promise<void> {
    if (this.running) return this.running;
    // Cleared in a `finally` callback, which always runs after this assignment (even when the
    // loop has nothing to send and ends at once).
    const task = this.loop(options).finally(() => {
      if (this.running === task) this.running = null;
    });
    this.running = task;
    return task;
  }

  private async loop(options: { keepalive: boolean }): Promise<void> {
    let rebases = 0;
    while (this.base && partsOf(this.pending).length) {
      const changes = { ...this.pending };
      if (this.view.status.state !== 'saving') this.update({ status: { state: 'saving' } });
      try {
        const saved = await this.deps.send({ baseVersion: this.base.version, changes }, options);
        // Confirmed parts leave the unsaved set, unless the tester changed them again meanwhile.
        for (const part of partsOf(changes)) if (same(this.pending[part], changes[part])) delete this.pending[part];
        this.base = saved.version >= this.base.version ? saved : this.base;
        this.persist();
        this.deps.onConfirmed?.(saved);
        this.retries = 0;
        if (partsOf(this.pending).length === 0) {
          this.update({ status: { state: 'saved', at: this.now().toISOString(), afterOffline: this.wasOffline } });
          this.wasOffline = false;
        } else this.update({});
      } catch (error) {
        if (error instanceof ApiError && error.status === 409 && error.code === 'stale_report' && rebases < MAX_REBASES) {
          const current = (error.body as { report?: ReportState } | undefined)?.report;
          if (current) {
            rebases += 1;
            this.rebase(current);
            this.deps.onConfirmed?.(current);
            this.update({});
            continue;
          }
        }
        this.failed(error);
        return;
      }
    }
    // Nothing left to send (all confirmed, or a change undone before it left): say so truthfully.
    if (this.base && partsOf(this.pending).length === 0 && this.view.status.state === 'saving') {
      this.update({ status: { state: 'saved', at: this.now().toISOString(), afterOffline: this.wasOffline } });
    }
  }

  private failed(error: unknown) {
    if (error instanceof ApiError && error.status === 0) {
      this.wasOffline = true;
      this.update({ status: { state: 'offline' } });
      this.scheduleRetry();
      return;
    }
    const status = error instanceof ApiError ? error.status : 500;
    // The server's own trouble (or a stale save that kept losing to others): try again by itself.
    // A refusal (bad input, past the due time) waits for the tester.
    const retrying = status >= 500 || (error instanceof ApiError && error.code === 'stale_report');
    const fields = error instanceof ApiError && error.fields ? Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k.replace(/^changes\./, ''), v])) : undefined;
    this.update({ status: { state: 'error', message: error instanceof Error ? error.message : 'The server did not take the changes.', fields, retrying } });
    if (retrying) this.scheduleRetry();
  }

  /** Sends every unsaved change now (leaving the screen, hiding the tab, "Try again"). */
  async flush(options: { keepalive: boolean } = { keepalive: false }) {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    if (this.retryTimer) clearTimeout(this.retryTimer);
    this.retryTimer = null;
    // A save already on its way is awaited first; changes made meanwhile go in the next one.
    while (this.running) await this.running;
    await this.run(options);
  }

  /** The page is going away: what is unsaved leaves in a request that outlives it (it is also still on this device). */
  leave() {
    if (!this.base || partsOf(this.pending).length === 0) return;
    this.deps.send({ baseVersion: this.base.version, changes: { ...this.pending } }, { keepalive: true }).catch(() => undefined);
  }

  /** The connection is back: send what waited. */
  online() {
    if (partsOf(this.pending).length) void this.flush();
  }

  /**
   * Submits only what the server has: first every change is saved; if any is not, nothing is
   * submitted and the reason is thrown. A report changed elsewhere since it was last seen here is
   * not submitted unseen.
   */
  async submit(): Promise<ReportState> {
    await this.flush();
    if (partsOf(this.pending).length || !this.base) {
      const s = this.view.status;
      const why = s.state === 'offline' ? 'there is no connection' : s.state === 'error' ? s.message : 'they are still being saved';
      throw new ApiError(409, 'unsaved', `Not submitted: your latest changes are not saved yet (${why}). They are kept on this device.`, s.state === 'error' ? s.fields : undefined);
    }
    try {
      const done = await this.deps.submit(this.base.version);
      this.base = done;
      this.deps.onConfirmed?.(done);
      this.update({});
      return done;
    } catch (error) {
      if (error instanceof ApiError && error.status === 409 && error.code === 'stale_report') {
        const current = (error.body as { report?: ReportState } | undefined)?.report;
        if (current) {
          this.rebase(current);
          this.update({});
        }
        throw new ApiError(409, 'stale_report', 'Not submitted: this report was changed in another window or on another device. Check it here, then submit again.');
      }
      if (error instanceof ApiError && (error.status === 0 || error.status >= 500)) {
        // The answer was lost, not necessarily the submission: ask the server what it holds.
        try {
          const now = await this.deps.fetch();
          this.load(now);
          if (now.submittedAt) return now;
        } catch {
          // Still unreachable: the error below stands.
        }
      }
      throw error;
    }
  }
}
