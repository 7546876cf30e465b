import http from 'node:http';
import { randomUUID } from 'node:crypto';
import type { Duplex } from 'node:stream';
import type { RequestListener } from 'node:http';
import { errorCodeForStatus } from '../errors.ts';

/** Requests Node refuses before Express sees them (header block too large, broken HTTP). */
const CLIENT_ERRORS: Record<string, { status: number; message: string }> = {
  HPE_HEADER_OVERFLOW: { status: 431, message: 'The request headers or address are too long (at most 16 KB together).' },
  HPE_URI_TOO_LONG: { status: 414, message: 'The address is too long.' },
  ERR_HTTP_REQUEST_TIMEOUT: { status: 408, message: 'The request took too long to arrive.' },
};

/**
 * The HTTP server for an app: Node's own refusals (an over-long query or header gives 431)
 * answer in the same envelope as everything else instead of an empty body.
 */
export function createHttpServer(app: RequestListener): http.Server {
  const server = http.createServer(app);
  // Longer than a load balancer's idle timeout, so the balancer (not us) closes idle connections.
  server.keepAliveTimeout = 65_000;
  server.headersTimeout = 66_000;
  server.on('clientError', (err: NodeJS.ErrnoException, socket: Duplex) => {
    if (!socket.writable || (err.code === 'ECONNRESET' && !socket.readable)) return void socket.destroy();
    const known = CLIENT_ERRORS[err.code ?? ''] ?? { status: 400, message: 'The request could not be read as HTTP.' };
    const body = JSON.stringify({ error: { code: errorCodeForStatus(known.status), message: known.message }, requestId: randomUUID() });
    socket.end(
      `HTTP/1.1 ${known.status} ${http.STATUS_CODES[known.status]}\r\n` +
        'content-type: application/json; charset=utf-8\r\n' +
        'cache-control: no-store\r\n' +
        `content-length: ${Buffer.byteLength(body)}\r\n` +
        'connection: close\r\n\r\n' +
        body,
    );
  });
  return server;
}
