import 'server-only';
import { HttpError } from './errors';

function tooLarge(maxBytes: number): HttpError {
  const message = `The request body is larger than ${Math.round(maxBytes / 1024)} kB.`;
  return new HttpError(413, message, [{ path: '(body)', message }]);
}

function cutOff(): HttpError {
  const message = 'The request body was cut off before it ended; send it again.';
  return new HttpError(400, message, [{ path: '(body)', message }]);
}

/**
 * The request body's bytes, read to at most `maxBytes`, so an oversized body is refused before it is
 * parsed. Trusts neither Content-Length nor its absence: the stream itself is counted. `refuse` makes
 * the 413 (callers name the field at fault, such as `file` for an upload).
 */
export async function readBodyBytes(request: Request, maxBytes: number, refuse: (maxBytes: number) => HttpError = tooLarge): Promise<Buffer<ArrayBuffer>> {
  const declared = Number(request.headers.get('content-length'));
  if (Number.isFinite(declared) && declared > maxBytes) throw refuse(maxBytes);
  if (!request.body) return Buffer.alloc(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    let chunk: ReadableStreamReadResult<Uint8Array>;
    try {
      chunk = await reader.read();
    } catch {
      // the connection broke mid-body (the client went away, as runaway clients do when they stop):
      // a fault of the request, not of the server, so it is answered, not logged as a failure
      throw cutOff();
    }
    const { done, value } = chunk;
    if (done) break;
    size += value.byteLength;
    if (size > maxBytes) {
      await reader.cancel();
      throw refuse(maxBytes);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}

/** The request body as UTF-8 text, read to at most `maxBytes` (413 beyond). */
export async function readBodyText(request: Request, maxBytes: number): Promise<string> {
  return (await readBodyBytes(request, maxBytes)).toString('utf8');
}
