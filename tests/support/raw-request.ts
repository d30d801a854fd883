// Requests written by hand on a socket-level client (node:http), for what fetch cannot do: send a huge body a
// piece at a time and stop as soon as the server answers, announce a length or none, and read the server's
// resident memory meanwhile.
import http from 'node:http';
import { readFileSync } from 'node:fs';

export interface RawAnswer {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: string;
  /** Bytes of the body written before the answer came. */
  sent: number;
}

export interface StreamedBody {
  /** Total bytes to send; with `announce`, also the Content-Length. */
  size: number;
  /** Send Content-Length (else the body is chunked). */
  announce: boolean;
  /** Bytes of each piece. */
  piece?: number;
  /** What the body starts with (then filled with `fill`). */
  prefix: string;
  fill?: string;
}

/** POSTs a body of `size` bytes piece by piece, stopping when the server answers; resolves with the answer. */
export function postStreamed(
  url: string,
  body: StreamedBody,
  headers: Record<string, string> = {},
): Promise<RawAnswer> {
  const piece = body.piece ?? 1 << 20;
  return new Promise((resolve, reject) => {
    let sent = 0;
    let answered = false;
    const request = http.request(url, {
      method: 'POST',
      headers: {
        'content-type': 'application/json',
        ...(body.announce ? { 'content-length': String(body.size) } : {}),
        ...headers,
      },
    });
    request.on('response', (response) => {
      answered = true;
      let text = '';
      response.setEncoding('utf8');
      response.on('data', (chunk) => (text += chunk));
      response.on('end', () => {
        resolve({ status: response.statusCode ?? 0, headers: response.headers, body: text, sent });
        request.destroy();
      });
    });
    request.on('error', (error) => {
      if (!answered) reject(error);
    });
    const filler = Buffer.alloc(piece, body.fill ?? 'a');
    const write = () => {
      while (!answered && sent < body.size) {
        const chunk = sent === 0 ? Buffer.concat([Buffer.from(body.prefix), filler]).subarray(0, piece) : filler;
        const part = chunk.subarray(0, Math.min(chunk.length, body.size - sent));
        sent += part.length;
        if (!request.write(part)) {
          request.once('drain', write);
          return;
        }
      }
      if (!answered && sent >= body.size) request.end();
    };
    write();
  });
}

/** Resident memory of a process, bytes (Linux /proc). */
export function residentBytes(pid: number): number {
  const match = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  if (!match) throw new Error(`no VmRSS for process ${pid}`);
  return Number(match[1]) * 1024;
}

/** The largest resident memory of a process while `work` runs, sampled every 20 ms. */
export async function peakResidentWhile<T>(pid: number, work: () => Promise<T>): Promise<{ result: T; peak: number }> {
  let peak = residentBytes(pid);
  const timer = setInterval(() => {
    peak = Math.max(peak, residentBytes(pid));
  }, 20);
  try {
    const result = await work();
    peak = Math.max(peak, residentBytes(pid));
    return { result, peak };
  } finally {
    clearInterval(timer);
  }
}
