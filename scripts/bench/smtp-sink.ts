// An SMTP server in a process of its own for the mail benchmark: takes every message, keeps only
// its recipient and subject, and answers counts (and duplicates) over IPC.
import { SMTPServer } from 'smtp-server';

const seen = new Map<string, number>();
let messages = 0;
const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS', 'AUTH'],
  logger: false,
  onData(stream, session, callback) {
    let head = '';
    stream.on('data', (chunk: Buffer) => {
      if (head.length < 8192) head += chunk.toString('utf8');
    });
    stream.on('end', () => {
      messages += 1;
      const subject = /^Subject: (.*)$/im.exec(head)?.[1] ?? '';
      const key = `${session.envelope.rcptTo.map((r) => r.address).join(',')}|${subject}`;
      seen.set(key, (seen.get(key) ?? 0) + 1);
      callback();
    });
  },
});
server.listen(0, '127.0.0.1', () => {
  const address = server.server.address();
  process.send?.({ port: typeof address === 'object' && address ? address.port : 0 });
});
process.on('message', (m: { ask?: string }) => {
  if (m.ask === 'counts') process.send?.({ messages, unique: seen.size, duplicates: [...seen.values()].filter((n) => n > 1).length });
  if (m.ask === 'reset') {
    seen.clear();
    messages = 0;
    process.send?.({ reset: true });
  }
});
