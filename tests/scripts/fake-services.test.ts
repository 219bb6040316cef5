import { GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { mkdtemp } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { startFakeServices, type FakeServices } from '../../scripts/fakes/fake-services';
import { createMailer } from '../../server/mail/mailer';
import { createStorage } from '../../server/storage/storage';

/**
 * The fakes are reached only through the same clients the server uses against real
 * services: nodemailer for SMTP and the AWS SDK for S3.
 */
describe('the local fakes', () => {
  let dataDir: string;
  let fakes: FakeServices;

  beforeAll(async () => {
    dataDir = await mkdtemp(path.join(os.tmpdir(), 'basted-fakes-'));
    fakes = await startFakeServices({ dataDir, buckets: ['drafts-t', 'photos-t'] });
  });
  afterAll(() => fakes.stop());

  const storageFor = (endpoint: string) =>
    createStorage({
      endpoint,
      region: 'us-east-1',
      accessKeyId: 'S3RVER',
      secretAccessKey: 'S3RVER',
      forcePathStyle: true,
      buckets: { drafts: 'drafts-t', photos: 'photos-t' },
    });

  it('store an object through the S3 SDK and give back the same bytes', async () => {
    const storage = storageFor(fakes.s3Endpoint);
    const body = Buffer.from('%PDF-1.4 a tiny draft');
    await storage.client.send(new PutObjectCommand({ Bucket: 'drafts-t', Key: 'k1', Body: body }));
    const got = await storage.client.send(new GetObjectCommand({ Bucket: 'drafts-t', Key: 'k1' }));
    expect(Buffer.from(await got.Body!.transformToByteArray())).toEqual(body);
    await expect(storage.check()).resolves.toBeUndefined();
    storage.close();
  });

  it('capture mail sent through nodemailer, readable by recipient through the inbox API, after a restart too', async () => {
    const mailer = createMailer({ host: '127.0.0.1', port: fakes.smtpPort, secure: false, from: 'Basted <no-reply@basted.test>' });
    await mailer.send({ to: 'Someone@Example.test', subject: 'Your draft is ready', text: 'Draft 2 is out.' });
    await mailer.send({ to: 'other@example.test', subject: 'Not for someone', text: '...' });
    mailer.close();

    const res = await fetch(`${fakes.inboxUrl}/api/messages?to=someone@example.test`);
    const { messages } = (await res.json()) as { messages: { subject: string; text: string; to: string[] }[] };
    expect(messages).toHaveLength(1);
    expect(messages[0]).toMatchObject({ subject: 'Your draft is ready', to: ['someone@example.test'] });
    expect(messages[0].text).toContain('Draft 2 is out.');

    const page = await (await fetch(`${fakes.inboxUrl}/`)).text();
    expect(page).toContain('Your draft is ready');

    // Messages are files in the data folder, so a restarted fake still has them.
    await fakes.stop();
    fakes = await startFakeServices({ dataDir, buckets: ['drafts-t', 'photos-t'] });
    const again = await (await fetch(`${fakes.inboxUrl}/api/messages?to=someone@example.test`)).json();
    expect(again.messages).toHaveLength(1);
  });

  it('when the SMTP server is stopped, a send fails with a connection error', async () => {
    const own = await startFakeServices({ dataDir: await mkdtemp(path.join(os.tmpdir(), 'basted-fakes-')), buckets: [] });
    await own.stopSmtp();
    const mailer = createMailer({ host: '127.0.0.1', port: own.smtpPort, secure: false, from: 'x@basted.test' });
    await expect(mailer.send({ to: 'a@example.test', subject: 's', text: 't' })).rejects.toThrow(/ECONNREFUSED|connect/i);
    mailer.close();
    await own.stop();
  });
});
