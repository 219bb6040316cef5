import request from 'supertest';
import { User } from '../../../db/models';
import { uniqueEmail } from '../../support/factories';
import { firstLink, waitForMessage } from '../../support/inbox';
import { buildTestApp, type TestApp } from '../../support/test-app';

describe('a new account’s time zone', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());

  /** The account is made from the link in the confirmation e-mail. */
  async function confirm(email: string) {
    const mail = await waitForMessage(email, 'Confirm your e-mail address');
    const token = new URL(firstLink(mail.text, '/verify-email')).searchParams.get('token')!;
    const done = await request(t.app).post('/api/auth/verify-email').send({ token });
    expect(done.status).toBe(201);
    return done;
  }

  it('is the one sent with the sign-up (the form sends the device’s zone)', async () => {
    const email = uniqueEmail('london');
    const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'Lon Don', email, password: 'a long enough pass', timeZone: 'Europe/London' });
    expect(res.status).toBe(202);
    // Kept with the sign-up until the address is confirmed, then given to the account.
    expect((await confirm(email)).body.user.timeZone).toBe('Europe/London');
    expect((await User.findOne({ where: { email } }))!.timeZone).toBe('Europe/London');
  });

  it('is refused naming the field when it is not a time zone, and nothing is created', async () => {
    const email = uniqueEmail('nowhere');
    const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'No Where', email, password: 'a long enough pass', timeZone: 'Mars/Olympus' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ timeZone: 'Choose a time zone such as Europe/London or America/Chicago' });
    expect(res.body.error.message).toBe('One answer needs a change.');
    expect(await User.count({ where: { email } })).toBe(0);
  });

  it('is UTC when none is sent', async () => {
    const email = uniqueEmail('plain');
    const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'Plain', email, password: 'a long enough pass' });
    expect(res.status).toBe(202);
    expect((await confirm(email)).body.user.timeZone).toBe('UTC');
  });
});
