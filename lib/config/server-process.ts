// What the web server process sets up once at start (instrumentation.ts): files it creates are private to the
// account it runs as, and every request carries the address of the socket it came on.
import http from 'node:http';
import { CLIENT_ADDRESS_HEADER } from '../api/client-address';

/** New files 0600 and folders 0700 (database, its journal, uploads, sample tables, the secret). */
export const PRIVATE_UMASK = 0o077;

let stamped = false;

/**
 * Writes the socket's address into CLIENT_ADDRESS_HEADER of every incoming request, over any value a client
 * sent, so that per-address limits cannot be dodged by a made-up header.
 */
function stampClientAddresses(): void {
  if (stamped) return;
  stamped = true;
  const emit = http.Server.prototype.emit;
  http.Server.prototype.emit = function stampedEmit(this: http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === 'request') {
      const request = args[0] as http.IncomingMessage;
      request.headers[CLIENT_ADDRESS_HEADER] = request.socket?.remoteAddress ?? 'unknown';
    }
    return emit.apply(this, [event, ...args] as Parameters<typeof emit>);
  } as typeof emit;
}

export function prepareServerProcess(): void {
  process.umask(PRIVATE_UMASK);
  stampClientAddresses();
}
