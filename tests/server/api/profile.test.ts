import request from 'supertest';
import { TesterProfile } from '../../../db/models';
import { bearer, createUser } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

describe('the tester profile', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());

  it('saves measurements in millimetres with units, time zone, experience and mail choices, and reads them back', async () => {
    const user = await createUser('profile');
    const auth = { Authorization: bearer(user, t.config) };
    const res = await request(t.app)
      .patch('/api/me/profile')
      .set(auth)
      .send({
        lengthUnit: 'cm',
        timeZone: 'Asia/Kolkata',
        experience: 'advanced',
        measurementsMm: { hip: 1041.4, waist: 812.8, height: 1625 },
        mail: { reminders: false },
      });
    expect(res.status).toBe(200);
    const got = await request(t.app).get('/api/me/profile').set(auth);
    expect(got.body).toMatchObject({
      lengthUnit: 'cm',
      timeZone: 'Asia/Kolkata',
      experience: 'advanced',
      measurementsMm: { hip: 1041.4, waist: 812.8, height: 1625 },
      mail: { reminders: false, trialNews: true, digest: true },
    });

    // A null clears one measurement; the object sent replaces the stored one.
    await request(t.app).patch('/api/me/profile').set(auth).send({ measurementsMm: { hip: 1041.4, waist: null } });
    expect((await request(t.app).get('/api/me/profile').set(auth)).body.measurementsMm).toEqual({ hip: 1041.4 });
  });

  it('refuses bad input naming each field, and keeps what was saved before', async () => {
    const user = await createUser('strict');
    const auth = { Authorization: bearer(user, t.config) };
    await request(t.app).patch('/api/me/profile').set(auth).send({ measurementsMm: { hip: 1000 }, experience: 'beginner' });

    const res = await request(t.app)
      .patch('/api/me/profile')
      .set(auth)
      .send({ measurementsMm: { hip: 30, wingspan: 1800 }, timeZone: 'Nowhere/Town', experience: 'wizard', lengthUnit: 'ft' });
    expect(res.status).toBe(400);
    const fields = Object.keys(res.body.error.fields);
    expect(fields).toEqual(expect.arrayContaining(['measurementsMm.hip', 'timeZone', 'experience', 'lengthUnit']));
    expect(fields.some((f) => f.startsWith('measurementsMm'))).toBe(true);

    const profile = await TesterProfile.findByPk(user.id);
    expect(profile!.measurementsMm).toEqual({ hip: 1000 });
    expect(profile!.experience).toBe('beginner');
  });

  it('is always the caller’s own: two testers never see each other’s measurements', async () => {
    const a = await createUser('a');
    const b = await createUser('b');
    await request(t.app).patch('/api/me/profile').set({ Authorization: bearer(a, t.config) }).send({ measurementsMm: { hip: 990 } });
    const asB = await request(t.app).get('/api/me/profile').set({ Authorization: bearer(b, t.config) });
    expect(asB.body.measurementsMm).toEqual({});
    expect(asB.body.email).toBe(b.email);
  });
});
