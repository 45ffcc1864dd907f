import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';

/**
 * The local stand-in for the hosted payment API. For now it starts, answers its health route and
 * shuts down cleanly; the payment intents, refunds and webhooks come with the booking issues.
 */
const port = Number(process.env.PORT ?? 12111);

function handle(req: IncomingMessage, res: ServerResponse): void {
  if (req.method === 'GET' && req.url === '/health') {
    res.writeHead(200, { 'content-type': 'application/json' });
    res.end(JSON.stringify({ status: 'ok', service: 'payments-fake' }));
    return;
  }
  res.writeHead(404, { 'content-type': 'application/json' });
  res.end(
    JSON.stringify({
      error: {
        type: 'invalid_request_error',
        message: `Unrecognized request URL (${req.method} ${req.url})`,
      },
    }),
  );
}

const server = createServer(handle);
server.listen(port, '127.0.0.1', () => console.log(`payments fake on http://127.0.0.1:${port}`));

for (const sig of ['SIGINT', 'SIGTERM'] as const) {
  process.on(sig, () => {
    server.close(() => process.exit(0));
    server.closeAllConnections();
  });
}
