import { createServer } from 'node:net';

/** Ask the kernel for a free TCP port on loopback. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.unref();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      srv.close(() => resolve(port));
    });
  });
}

/** The preferred port when it is free on loopback, else any free one. */
export function preferPort(preferred: number): Promise<number> {
  return new Promise((resolve) => {
    const srv = createServer();
    srv.unref();
    srv.once('error', () => void freePort().then(resolve));
    srv.listen(preferred, '127.0.0.1', () => srv.close(() => resolve(preferred)));
  });
}
