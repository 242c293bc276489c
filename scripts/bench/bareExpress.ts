/**
 * The HTTP baseline: Express 5 with one POST route that answers at once — no helmet, no token,
 * no body parsing, no database — so its rate is what HTTP and Express cost on this machine.
 */
import http from 'node:http';

import express from 'express';

export async function startBareExpress(port: number, host = '127.0.0.1'): Promise<http.Server> {
  const app = express();
  app.disable('x-powered-by');
  app.post('/bare', (_req, res) => {
    res.status(202).json({ stored: 1 });
  });
  const server = http.createServer(app);
  await new Promise<void>((resolve) => server.listen(port, host, resolve));
  return server;
}
