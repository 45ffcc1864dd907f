import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import { SMTPServer } from 'smtp-server';

/**
 * The local mail fake: an SMTP server the app sends to through nodemailer, and a web port with a
 * health route. The inbox page and the JSON inbox come with the accounts issue.
 */
const smtpPort = Number(process.env.SMTP_PORT ?? 1025);
const webPort = Number(process.env.WEB_PORT ?? 8025);

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  onData(stream, _session, callback) {
    stream.resume();
    stream.on('end', () => callback());
  },
});
smtp.listen(smtpPort, '127.0.0.1');

function handle(req: IncomingMessage, res: ServerResponse): void {
  if (req.method === 'GET' && req.url === '/health') {
    res.writeHead(200, { 'content-type': 'application/json' });
    res.end(JSON.stringify({ status: 'ok', service: 'mail-fake' }));
    return;
  }
  res.writeHead(404, { 'content-type': 'text/plain' });
  res.end('Not found');
}

const web = createServer(handle);
web.listen(webPort, '127.0.0.1', () =>
  console.log(`mail fake: SMTP on 127.0.0.1:${smtpPort}, inbox on http://127.0.0.1:${webPort}`),
);

for (const sig of ['SIGINT', 'SIGTERM'] as const) {
  process.on(sig, () => {
    web.closeAllConnections();
    web.close();
    smtp.close(() => process.exit(0));
  });
}
