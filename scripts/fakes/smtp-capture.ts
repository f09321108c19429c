/**
 * Local SMTP capture server for the demo and the tests: accepts every message on loopback,
 * keeps it in memory and lists it over a tiny HTTP API (GET /messages, DELETE /messages).
 * Nothing leaves the machine.
 */
import { createServer } from 'node:http';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

interface Captured {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const httpPort = Number(process.env.SMTP_HTTP_PORT ?? smtpPort + 1);
const messages: Captured[] = [];
let nextId = 1;

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS', 'AUTH'],
  logger: false,
  size: 10 * 1024 * 1024,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const to = session.envelope.rcptTo.map((r) => r.address);
        messages.push({
          id: nextId++,
          receivedAt: new Date().toISOString(),
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          to,
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          html: typeof mail.html === 'string' ? mail.html : null,
        });
        callback();
      })
      .catch((err: Error) => callback(err));
  },
});

const http = createServer((req, res) => {
  if (req.url === '/messages' && req.method === 'GET') {
    res.writeHead(200, { 'content-type': 'application/json' });
    res.end(JSON.stringify(messages));
  } else if (req.url === '/messages' && req.method === 'DELETE') {
    messages.length = 0;
    res.writeHead(204).end();
  } else if (req.url === '/health') {
    res.writeHead(200).end('ok');
  } else {
    res.writeHead(404).end();
  }
});

smtp.listen(smtpPort, '127.0.0.1', () => {
  http.listen(httpPort, '127.0.0.1', () => {
    console.log(`SMTP capture on 127.0.0.1:${smtpPort}, messages at http://127.0.0.1:${httpPort}/messages`);
  });
});

const stop = (): void => {
  smtp.close(() => http.close(() => process.exit(0)));
  setTimeout(() => process.exit(0), 1000).unref();
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
