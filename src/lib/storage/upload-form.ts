import 'server-only';
import { HttpError, unprocessable, type FieldIssue } from '../http/errors';
import { MAX_ATTACHMENT_BYTES } from './content-type';
import { readBodyBytes } from '../http/body-limit';
import { zodIssues } from '../http/respond';
import { attachmentFieldsSchema, type AttachmentFields } from '../validations/attachment';

/** Room for the multipart boundaries, headers and the other fields around the largest file [bytes]. */
const FORM_OVERHEAD_BYTES = 64 * 1024;
/** Largest upload body read at all; each kind's own limit is checked once the kind is known [bytes]. */
export const MAX_UPLOAD_BODY_BYTES = Math.max(...Object.values(MAX_ATTACHMENT_BYTES)) + FORM_OVERHEAD_BYTES;

function tooLarge(maxBytes: number): HttpError {
  const message = `The file is larger than ${Math.floor(maxBytes / (1024 * 1024))} MB.`;
  return new HttpError(413, message, [{ path: 'file', message }]);
}

/**
 * The body of a multipart/form-data request, refused with 413 (naming `file`) as soon as it passes
 * `maxBytes` (the shared bounded reader: Content-Length first, then the stream counted).
 */
export async function readMultipartForm(request: Request, maxBytes = MAX_UPLOAD_BODY_BYTES): Promise<FormData> {
  const contentType = request.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data\s*;/i.test(contentType)) {
    throw new HttpError(415, 'Send the file as multipart/form-data.', [{ path: '(body)', message: 'Expected multipart/form-data.' }]);
  }
  const body = await readBodyBytes(request, maxBytes, tooLarge);
  try {
    return await new Response(body, { headers: { 'Content-Type': contentType } }).formData();
  } catch {
    throw unprocessable('The upload could not be read; send it again.', [{ path: '(body)', message: 'Malformed multipart/form-data.' }]);
  }
}

export interface AttachmentForm {
  fields: AttachmentFields;
  file: { name: string; bytes: Buffer };
}

/** The text fields of the attachment form, beside its `file`. */
const TEXT_FIELDS = ['kind', 'pointId', 'caption'] as const;

/**
 * The attachment form's fields, parsed with the shared schema, and its file; one 422 listing every
 * field that needs attention, `file` included when no file was sent. A text field sent as a file, or
 * any field sent twice, is named too: taking it as absent would file a point's photo under the whole
 * plan without a word.
 */
export async function parseAttachmentForm(form: FormData): Promise<AttachmentForm> {
  const issues: FieldIssue[] = [];
  const texts: Partial<Record<(typeof TEXT_FIELDS)[number], string>> = {};
  for (const name of TEXT_FIELDS) {
    const [value, ...more] = form.getAll(name);
    if (more.length > 0) issues.push({ path: name, message: 'Send this field once.' });
    else if (typeof value === 'string') texts[name] = value;
    else if (value !== undefined) issues.push({ path: name, message: 'Send this field as text, not as a file.' });
  }
  const parsed = attachmentFieldsSchema.safeParse(texts);
  if (!parsed.success) issues.push(...zodIssues(parsed.error).filter((issue) => !issues.some((i) => i.path === issue.path)));
  const files = form.getAll('file');
  const file = files[0] ?? null;
  const noFile = file === null || typeof file === 'string' || (file.size === 0 && !file.name);
  if (files.length > 1) issues.push({ path: 'file', message: 'Send one file at a time.' });
  else if (noFile) issues.push({ path: 'file', message: 'Choose a file to upload.' });
  if (issues.length > 0 || !parsed.success || noFile) throw unprocessable('Some fields need attention.', issues);
  return { fields: parsed.data, file: { name: file.name, bytes: Buffer.from(await file.arrayBuffer()) } };
}
