/**
 * Finds a free TCP port on 127.0.0.1, so that several test runs on one machine (two checkouts, or a
 * developer and CI) never fight over a port.
 */
import { createServer } from 'node:net';

/** Whether `port` can be bound on 127.0.0.1 right now. */
export function isPortFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const server = createServer();
    server.once('error', () => resolve(false));
    server.listen(port, '127.0.0.1', () => server.close(() => resolve(true)));
  });
}

/** The first free port from `start` upwards (at most `tries` ports are tried). */
export async function findFreePort(start: number, tries = 200): Promise<number> {
  for (let port = start; port < start + tries; port++) if (await isPortFree(port)) return port;
  throw new Error(`No free port on 127.0.0.1 between ${start} and ${start + tries - 1}.`);
}
