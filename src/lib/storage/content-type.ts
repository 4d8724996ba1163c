import { HttpError } from '../http/errors';
import { appendExtension } from './object-keys';

/**
 * What an uploaded file really is, from its bytes: the browser's Content-Type and the file's name
 * are claims anyone can set, so neither decides. Photos must be JPEG, PNG or WebP; instrument files
 * PDF or UTF-8 text (Touchstone, CSV, plain text). Everything else is refused.
 *
 * A small table of magic numbers rather than a sniffing package: only four binary formats are
 * accepted, text needs a check of our own anyway, and the well-known package (file-type) is
 * ESM-only from version 17 and needs Node 22 from version 22.
 */

export const ATTACHMENT_KINDS = ['photo', 'instrument'] as const;
export type AttachmentKind = (typeof ATTACHMENT_KINDS)[number];

const MB = 1024 * 1024;
/** Largest file of each kind [bytes]: camera photos of the bench; instrument exports and reports. */
export const MAX_ATTACHMENT_BYTES: Record<AttachmentKind, number> = { photo: 15 * MB, instrument: 10 * MB };

export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export const INSTRUMENT_TYPES = ['application/pdf', 'text/plain', 'text/csv'] as const;
export type AttachmentContentType = (typeof PHOTO_TYPES)[number] | (typeof INSTRUMENT_TYPES)[number];

const ascii = (text: string) => Array.from(text, (c) => c.charCodeAt(0));

/** JPEG: the SOI marker FF D8 followed by the first marker segment's FF (ITU-T T.81, Annex B). */
const JPEG_START = [0xff, 0xd8, 0xff];
/** The 8-byte PNG signature (PNG specification, section 5.2). */
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
/** WebP: a RIFF container, "RIFF", a 4-byte little-endian size, then the form type "WEBP" (RFC 9649). */
const RIFF = ascii('RIFF');
const WEBP = ascii('WEBP');
/** PDF: the file header "%PDF-" followed by the version (ISO 32000-1, section 7.5.2). */
const PDF_HEADER = ascii('%PDF-');

function hasAt(bytes: Uint8Array, signature: readonly number[], offset = 0): boolean {
  if (bytes.length < offset + signature.length) return false;
  return signature.every((byte, i) => bytes[offset + i] === byte);
}

/** The binary formats we accept, by their leading bytes; null for anything else. */
export function sniffBinaryType(bytes: Uint8Array): 'image/jpeg' | 'image/png' | 'image/webp' | 'application/pdf' | null {
  if (hasAt(bytes, JPEG_START)) return 'image/jpeg';
  if (hasAt(bytes, PNG_SIGNATURE)) return 'image/png';
  if (hasAt(bytes, RIFF) && hasAt(bytes, WEBP, 8)) return 'image/webp';
  if (hasAt(bytes, PDF_HEADER)) return 'application/pdf';
  return null;
}

// Control characters other than tab, line feed, form feed and carriage return do not occur in
// instrument text exports; NUL in particular marks a binary file.
const BINARY_CONTROL = /[\u0000-\u0008\u000b\u000e-\u001f\u007f]/;

/** The text of a file that is valid UTF-8 without binary control characters; null otherwise. */
export function decodeText(bytes: Uint8Array): string | null {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
  return BINARY_CONTROL.test(text) ? null : text;
}

/** Touchstone v1 names its files .s<ports>p (.s1p, .s2p, ...); v2 files often end .ts. */
const TOUCHSTONE_EXTENSION = /\.(s\d{1,2}p|ts)$/i;

/** Rows that all hold the same number (at least one) of commas look like CSV. */
function looksLikeCsv(text: string): boolean {
  const rows = text.split(/\r?\n/).filter((line) => line.trim() !== '' && !/^[!#]/.test(line)).slice(0, 5);
  if (rows.length === 0) return false;
  const commas = rows.map((row) => (row.match(/,/g) ?? []).length);
  return commas[0] > 0 && commas.every((n) => n === commas[0]);
}

/** text/csv for .csv files and comma tables; text/plain for Touchstone and other text. */
export function textType(text: string, fileName: string): 'text/csv' | 'text/plain' {
  if (/\.csv$/i.test(fileName)) return 'text/csv';
  if (TOUCHSTONE_EXTENSION.test(fileName) || /\.txt$/i.test(fileName)) return 'text/plain';
  return looksLikeCsv(text) ? 'text/csv' : 'text/plain';
}

/** Extensions a file of each type may keep; any other name gets the first one appended. */
const EXTENSIONS: Record<AttachmentContentType, { pattern: RegExp; append: string }> = {
  'image/jpeg': { pattern: /\.jpe?g$/i, append: '.jpg' },
  'image/png': { pattern: /\.png$/i, append: '.png' },
  'image/webp': { pattern: /\.webp$/i, append: '.webp' },
  'application/pdf': { pattern: /\.pdf$/i, append: '.pdf' },
  'text/csv': { pattern: /\.csv$/i, append: '.csv' },
  'text/plain': { pattern: /\.(txt|text|dat|log|tsv|prn|s\d{1,2}p|ts)$/i, append: '.txt' },
};

/**
 * The name with an extension that matches the content, so a download never opens as something
 * else: text saved as "run.bat" is offered as "run.bat.txt".
 */
export function nameForType(fileName: string, contentType: AttachmentContentType): string {
  const { pattern, append } = EXTENSIONS[contentType];
  return pattern.test(fileName) ? fileName : appendExtension(fileName, append);
}

const fileIssue = (status: number, message: string) => new HttpError(status, message, [{ path: 'file', message }]);

const sizeLabel = (bytes: number) => `${bytes / MB} MB`;

/** 422 for an empty file, 413 for one over the kind's limit. */
export function checkAttachmentSize(kind: AttachmentKind, size: number): void {
  if (size === 0) throw fileIssue(422, 'The file is empty.');
  const max = MAX_ATTACHMENT_BYTES[kind];
  if (size > max) throw fileIssue(413, `${kind === 'photo' ? 'A photo' : 'An instrument file'} can be at most ${sizeLabel(max)}.`);
}

/**
 * The checked type of an upload of `kind`, and the name to keep (its extension matching the type).
 * 413/422 for the size, 415 naming `file` when the content is not an accepted type for the kind.
 */
export function checkAttachmentContent(
  kind: AttachmentKind,
  bytes: Uint8Array,
  fileName: string,
): { contentType: AttachmentContentType; fileName: string } {
  checkAttachmentSize(kind, bytes.length);
  const binary = sniffBinaryType(bytes);
  const isImage = binary !== null && binary !== 'application/pdf';
  if (kind === 'photo') {
    if (!isImage) {
      const hint = binary === 'application/pdf' || decodeText(bytes) !== null ? ' Upload documents and data as an instrument file.' : '';
      throw fileIssue(415, `A photo must be a JPEG, PNG or WebP image; this file is not one.${hint}`);
    }
    return { contentType: binary, fileName: nameForType(fileName, binary) };
  }
  if (isImage) throw fileIssue(415, 'Instrument files are PDF or text (Touchstone, CSV, TXT); upload pictures as a photo.');
  if (binary === 'application/pdf') return { contentType: binary, fileName: nameForType(fileName, binary) };
  const text = decodeText(bytes);
  if (text === null) {
    throw fileIssue(415, 'An instrument file must be a PDF or a UTF-8 text file (Touchstone .s2p, CSV, TXT); this file is neither.');
  }
  const type = textType(text, fileName);
  return { contentType: type, fileName: nameForType(fileName, type) };
}
