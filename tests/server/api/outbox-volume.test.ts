import { OutboxMessage } from '../../../db/models';
import { enqueue, flushOutbox, OUTBOX_IN_FLIGHT } from '../../../server/outbox/outbox.service';
import { startMailHarness, type MailHarness } from './mail-support';

/** Many messages due at once: pooled connections, a bound on messages in flight, none left behind, none twice. */
describe('delivering a due evening of mail', () => {
  let h: MailHarness;
  beforeAll(async () => {
    h = await startMailHarness();
  });
  afterAll(() => h.close());
  const deps = () => ({ config: h.t.config, mailer: h.t.mailer });

  it('delivers every due message once, over a few pooled connections, even past the old hundred rounds', async () => {
    const total = 300;
    for (let i = 0; i < total; i += 1) {
      await enqueue(deps(), { key: `volume:${i}`, to: { id: null, email: `volume-${i}@example.test` }, template: 'test', category: 'essential', content: { subject: `Volume ${i}`, text: 'hello', html: '<p>hello</p>' } });
    }
    const before = h.capture.connections;
    // Batches of 2: a run capped at 100 rounds would stop at 200 of the 300.
    const settled = await flushOutbox(deps(), new Date(), 2);
    expect(settled).toHaveLength(total);
    expect(settled.every((s) => s.status === 'sent')).toBe(true);
    expect(await OutboxMessage.count({ where: { status: 'sent' } })).toBe(total);
    const subjects = h.capture.messages.map((m) => m.subject);
    expect(subjects).toHaveLength(total);
    expect(new Set(subjects).size).toBe(total);
    // Pooled: a handful of connections for 300 messages (one each before).
    expect(h.capture.connections - before).toBeGreaterThan(0);
    expect(h.capture.connections - before).toBeLessThanOrEqual(OUTBOX_IN_FLIGHT);
    // A second run finds nothing due: nothing goes twice.
    expect(await flushOutbox(deps(), new Date())).toEqual([]);
    expect(h.capture.messages).toHaveLength(total);
  });
});
