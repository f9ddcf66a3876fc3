import { SMTPServer } from 'smtp-server';

export interface ReceivedMail {
  from: string;
  to: string[];
  raw: string;
  receivedAt: Date;
}

/**
 * A local stand-in for the shop's mail server: speaks real SMTP on loopback and keeps every
 * message it receives, so the app, the outbox page and the tests can see what went out.
 */
export async function startFakeSmtp(port = 0, host = '127.0.0.1') {
  const received: ReceivedMail[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Benchwright local mail catcher',
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        received.push({
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          to: session.envelope.rcptTo.map((r) => r.address),
          raw: Buffer.concat(chunks).toString('utf8'),
          receivedAt: new Date(),
        });
        callback();
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const address = server.server.address();
  return {
    port: typeof address === 'object' && address ? address.port : port,
    received,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
