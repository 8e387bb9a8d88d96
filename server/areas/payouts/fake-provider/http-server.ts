import http from 'node:http';
import { asFakeError, errorBody } from './errors';
import { newId } from './ids';

// The fake's HTTP plumbing: reads each request whole, hands it to the fake, writes the
// answer (an error thrown on the way becomes the provider's error envelope). Also how a
// local server listens on the loopback interface and closes, which the tests' own small
// servers use too.

export type FakeRequest = {
  method: string;
  path: string;
  query: URLSearchParams;
  body: string;
  /** A request header as a single string, or undefined. */
  header(name: string): string | undefined;
};

export type Answer = { status: number; headers: Record<string, string>; body: string };

/** A JSON answer with the provider's Request-Id header. */
export function jsonAnswer(status: number, body: string, headers: Record<string, string> = {}): Answer {
  return { status, headers: { 'content-type': 'application/json', 'request-id': newId('req'), ...headers }, body };
}

export function createFakeHttpServer(answer: (req: FakeRequest) => Answer | Promise<Answer>): http.Server {
  return http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const url = new URL(req.url ?? '/', 'http://127.0.0.1');
      const request: FakeRequest = {
        method: req.method ?? 'GET',
        path: url.pathname,
        query: url.searchParams,
        body: Buffer.concat(chunks).toString('utf8'),
        header: (name) => {
          const value = req.headers[name.toLowerCase()];
          return typeof value === 'string' ? value : undefined;
        },
      };
      const write = (a: Answer) => {
        res.writeHead(a.status, a.headers);
        res.end(a.body);
      };
      new Promise<Answer>((resolve) => resolve(answer(request))).then(write, (error: unknown) => {
        const e = asFakeError(error);
        write(jsonAnswer(e.status, errorBody(e)));
      });
    });
  });
}

/** Listens on 127.0.0.1 at a free port. */
export async function listenOnLoopback(server: http.Server): Promise<{ port: number; url: string }> {
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  const address = server.address();
  if (address === null || typeof address === 'string') throw new Error(`the server is not listening on a TCP port (${String(address)})`);
  const { port } = address;
  return { port, url: `http://127.0.0.1:${port}` };
}

/** Stops listening and drops the open connections (keep-alive ones included). */
export async function closeServer(server: http.Server): Promise<void> {
  await new Promise<void>((resolve) => {
    server.close(() => resolve());
    server.closeAllConnections();
  });
}
