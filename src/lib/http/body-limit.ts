import 'server-only';
import { HttpError } from './errors';

function tooLarge(maxBytes: number): HttpError {
  const message = `The request body is larger than ${Math.round(maxBytes / 1024)} kB.`;
  return new HttpError(413, message, [{ path: '(body)', message }]);
}

/**
 * The request body as text, read to at most `maxBytes` (413 beyond), so an oversized body is refused
 * before it is parsed. Trusts neither Content-Length nor its absence: the stream itself is counted.
 */
export async function readBodyText(request: Request, maxBytes: number): Promise<string> {
  const declared = Number(request.headers.get('content-length'));
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge(maxBytes);
  if (!request.body) return '';
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > maxBytes) {
      await reader.cancel();
      throw tooLarge(maxBytes);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString('utf8');
}
