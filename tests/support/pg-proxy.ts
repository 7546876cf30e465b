// A TCP relay between an app and the test PostgreSQL, to take "the database" away and bring it
// back as a restart would: open connections cut, new ones refused, then accepted again.
import net from 'node:net';

export interface PgProxy {
  /** The same database URL, through the relay. */
  via(url: string): string;
  /** Cuts every open connection and refuses new ones (PostgreSQL stopping). */
  down(): Promise<void>;
  /** Accepts connections again on the same port (PostgreSQL back). */
  up(): Promise<void>;
  close(): Promise<void>;
}

export async function startPgProxy(target: URL): Promise<PgProxy> {
  const sockets = new Set<net.Socket>();
  const server = net.createServer((client) => {
    const upstream = net.connect(Number(target.port || 5432), target.hostname);
    for (const s of [client, upstream]) {
      sockets.add(s);
      s.on('close', () => sockets.delete(s));
      s.on('error', () => (client.destroy(), upstream.destroy()));
    }
    client.pipe(upstream).pipe(client);
  });
  const listen = (port: number) => new Promise<void>((resolve) => server.listen(port, '127.0.0.1', () => resolve()));
  await listen(0);
  const port = (server.address() as net.AddressInfo).port;
  const stop = () =>
    new Promise<void>((resolve) => {
      server.close(() => resolve());
      for (const s of sockets) s.destroy();
    });
  return {
    via(url) {
      const u = new URL(url);
      u.hostname = '127.0.0.1';
      u.port = String(port);
      return u.toString();
    },
    down: stop,
    up: () => listen(port),
    close: () => (server.listening ? stop() : Promise.resolve()),
  };
}
