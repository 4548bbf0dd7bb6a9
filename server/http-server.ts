import type { Server } from 'node:http';
import type { Express } from 'express';

/** Listens on 127.0.0.1 (loopback only unless a proxy is put in front). Port 0 picks a free port. */
export function listen(app: Express, port: number, host = '127.0.0.1'): Promise<{ server: Server; port: number; close: () => Promise<void> }> {
  return new Promise((resolve, reject) => {
    const server = app.listen(port, host);
    server.once('error', reject);
    server.once('listening', () => {
      const address = server.address();
      const actual = typeof address === 'object' && address ? address.port : port;
      resolve({
        server,
        port: actual,
        close: () =>
          new Promise<void>((done) => {
            server.close(() => done());
            server.closeAllConnections();
          }),
      });
    });
  });
}
