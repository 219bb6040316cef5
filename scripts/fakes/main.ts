/** Runs the local fakes as one long-lived process (started by scripts/fakes.sh). */
import path from 'node:path';
import { startFakeServices } from './fake-services';

const dataDir = process.env.BASTED_DATA_DIR ?? path.resolve(__dirname, '../../.data');

startFakeServices({
  dataDir,
  s3Port: Number(process.env.FAKE_S3_PORT ?? 4569),
  smtpPort: Number(process.env.FAKE_SMTP_PORT ?? 1025),
  inboxPort: Number(process.env.FAKE_INBOX_PORT ?? 1080),
  buckets: [process.env.S3_BUCKET_DRAFTS ?? 'basted-drafts', process.env.S3_BUCKET_PHOTOS ?? 'basted-photos'],
}).then(
  (fakes) => {
    console.log(`fake S3 ${fakes.s3Endpoint}, fake SMTP 127.0.0.1:${fakes.smtpPort}, inbox ${fakes.inboxUrl}`);
    const stop = () => {
      fakes.stop().finally(() => process.exit(0));
    };
    process.on('SIGTERM', stop);
    process.on('SIGINT', stop);
  },
  (error: unknown) => {
    console.error('the local fakes could not start:', error);
    process.exit(1);
  },
);
