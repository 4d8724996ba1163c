import { HttpError } from '../../../src/lib/http/errors';
import { MAX_UPLOAD_BODY_BYTES, parseAttachmentForm, readMultipartForm } from '../../../src/lib/storage/upload-form';

const URL_ = 'http://127.0.0.1/api/studies/1/plans/1/attachments';

async function refusal(action: () => Promise<unknown>): Promise<{ status: number; paths: string[] }> {
  try {
    await action();
  } catch (error) {
    if (!(error instanceof HttpError)) throw error;
    return { status: error.status, paths: error.issues.map((i) => i.path).sort() };
  }
  throw new Error('expected a refusal');
}

function formRequest(form: FormData): Request {
  return new Request(URL_, { method: 'POST', body: form });
}

describe('reading the upload form', () => {
  it('refuses a body whose Content-Length is over the limit before reading it (413 at file)', async () => {
    let pulled = false;
    // highWaterMark 0: the stream is pulled only when someone reads it.
    const body = new ReadableStream(
      {
        pull(controller) {
          pulled = true;
          controller.close();
        },
      },
      { highWaterMark: 0 },
    );
    const request = new Request(URL_, {
      method: 'POST',
      body,
      headers: { 'content-type': 'multipart/form-data; boundary=x', 'content-length': String(MAX_UPLOAD_BODY_BYTES + 1) },
      duplex: 'half',
    } as RequestInit);
    expect(await refusal(() => readMultipartForm(request))).toEqual({ status: 413, paths: ['file'] });
    expect(pulled).toBe(false);
  });

  it('counts the stream when no length is declared and stops at the limit (413 at file)', async () => {
    let sent = 0;
    const chunk = new Uint8Array(64 * 1024);
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        sent += chunk.length;
        controller.enqueue(chunk);
      },
    });
    const request = new Request(URL_, { method: 'POST', body, headers: { 'content-type': 'multipart/form-data; boundary=x' }, duplex: 'half' } as RequestInit);
    expect(await refusal(() => readMultipartForm(request, 1024 * 1024))).toEqual({ status: 413, paths: ['file'] });
    expect(sent).toBeLessThan(2 * 1024 * 1024);
  });

  it('refuses anything but multipart/form-data (415)', async () => {
    const request = new Request(URL_, { method: 'POST', body: '{"kind":"photo"}', headers: { 'content-type': 'application/json' } });
    expect((await refusal(() => readMultipartForm(request))).status).toBe(415);
  });

  it('names every missing part at once: no file and no kind (422 at file and kind)', async () => {
    const form = new FormData();
    form.append('caption', 'no file here');
    const parsed = await readMultipartForm(formRequest(form));
    expect(await refusal(() => parseAttachmentForm(parsed))).toEqual({ status: 422, paths: ['file', 'kind'] });
  });

  it('a point that is not an id is refused at pointId', async () => {
    const form = new FormData();
    form.append('kind', 'instrument');
    form.append('pointId', 'seven');
    form.append('file', new Blob(['# MHz S RI R 50\n']), 'a.s1p');
    expect(await refusal(async () => parseAttachmentForm(await readMultipartForm(formRequest(form))))).toEqual({ status: 422, paths: ['pointId'] });
  });

  it('returns the parsed fields and the exact bytes of the file', async () => {
    const bytes = new Uint8Array([0xff, 0xd8, 0xff, 0x00, 0x10, 0x80, 0xfe]);
    const form = new FormData();
    form.append('kind', 'photo');
    form.append('pointId', '');
    form.append('caption', '  pad from above  ');
    form.append('file', new Blob([bytes], { type: 'text/plain' }), 'bench.jpg');
    const { fields, file } = await parseAttachmentForm(await readMultipartForm(formRequest(form)));
    expect(fields).toEqual({ kind: 'photo', pointId: null, caption: 'pad from above' });
    expect(file.name).toBe('bench.jpg');
    expect([...file.bytes]).toEqual([...bytes]);
  });

  it('a text field sent as a file is refused at that field, not read as absent', async () => {
    const form = new FormData();
    form.append('kind', 'photo');
    // a point's photo whose point id arrived as a file would otherwise be filed under the whole plan
    form.append('pointId', new Blob(['12']), 'point.txt');
    form.append('caption', new Blob(['pad from above']), 'caption.txt');
    form.append('file', new Blob([new Uint8Array([0xff, 0xd8, 0xff])]), 'bench.jpg');
    expect(await refusal(async () => parseAttachmentForm(await readMultipartForm(formRequest(form))))).toEqual({ status: 422, paths: ['caption', 'pointId'] });
  });

  it('a field or a file sent twice is refused at its name', async () => {
    const form = new FormData();
    form.append('kind', 'photo');
    form.append('kind', 'instrument');
    form.append('pointId', '3');
    form.append('file', new Blob([new Uint8Array([0xff, 0xd8, 0xff])]), 'one.jpg');
    form.append('file', new Blob([new Uint8Array([0xff, 0xd8, 0xff])]), 'two.jpg');
    expect(await refusal(async () => parseAttachmentForm(await readMultipartForm(formRequest(form))))).toEqual({ status: 422, paths: ['file', 'kind'] });
  });
});
