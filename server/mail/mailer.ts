import nodemailer from 'nodemailer';

export type SmtpSettings = {
  host: string;
  port: number;
  secure: boolean;
  user?: string;
  password?: string;
  from: string;
};

export type OutgoingMail = { to: string; subject: string; text: string; html?: string; headers?: Record<string, string> };

export type Mailer = {
  send(mail: OutgoingMail): Promise<{ messageId: string }>;
  /** Connects and greets the SMTP server; throws with the reason when it cannot. */
  check(): Promise<void>;
  close(): void;
};

export function createMailer(config: SmtpSettings): Mailer {
  const transporter = nodemailer.createTransport({
    host: config.host,
    port: config.port,
    secure: config.secure,
    // A plain local server offers no TLS; a real provider on 587 upgrades with STARTTLS.
    ignoreTLS: !config.secure && !config.user,
    auth: config.user ? { user: config.user, pass: config.password ?? '' } : undefined,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    // A few kept-open connections carry every message (one new connection per message managed
    // about 9 a second); the outbox bounds how many wait here at once (OUTBOX_IN_FLIGHT).
    pool: true,
    maxConnections: 5,
    maxMessages: 1000,
  });
  return {
    async send(mail) {
      const info = await transporter.sendMail({ from: config.from, ...mail });
      return { messageId: info.messageId };
    },
    async check() {
      await transporter.verify();
    },
    close() {
      transporter.close();
    },
  };
}
