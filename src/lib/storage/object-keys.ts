/**
 * Object keys and file names. A key never contains anything the uploader typed: it is the study,
 * the plan and a random UUID. The uploaded name is kept only for people (lists, downloads), after
 * it has been cut down to a plain name that cannot climb out of a folder or disguise itself.
 */

/** Longest kept file name [characters]; the attachments.file_name column holds 200. */
export const MAX_FILE_NAME_LENGTH = 200;
/** Longest extension kept whole when a name is shortened [characters, with the dot]. */
const MAX_KEPT_EXTENSION = 16;

function positiveId(value: number, what: string): number {
  if (!Number.isSafeInteger(value) || value <= 0) throw new RangeError(`${what} must be a positive whole number`);
  return value;
}

/** `studies/<studyId>/plans/<planId>/<uuid>`: where an attachment's bytes are stored. */
export function attachmentObjectKey(studyId: number, planId: number, uuid: string = crypto.randomUUID()): string {
  return `studies/${positiveId(studyId, 'studyId')}/plans/${positiveId(planId, 'planId')}/${uuid}`;
}

// C0 and C1 control characters (NUL, newlines, escape sequences, DEL).
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f-\u009f]/g;
// Bidirectional overrides and zero-width characters: "photo\u202Egpj.exe" displays as "photoexe.jpg".
const INVISIBLE_FORMATTING = /[\u061c\u200b-\u200f\u202a-\u202e\u2060-\u2064\u2066-\u2069\ufeff]/g;
// Slashes and backslashes in disguise (fraction and division slashes, fullwidth and small forms, the
// set-minus and big solidi): some tools turn them into real separators when a file is saved or copied.
const LOOKALIKE_SEPARATORS = /[\u2044\u2215\u2216\u29f5\u29f8\u29f9\ufe68\uff0f\uff3c]/g;
// Dots in disguise (one-dot leader, fullwidth full stop), so "．．" cannot pass as an ordinary name.
const LOOKALIKE_DOTS = /[\u2024\uff0e]/g;
// Characters Windows refuses in file names; a download named with them would be renamed or fail.
const RESERVED_CHARACTERS = /[<>:"|?*]/g;

/** Shortens to `max` characters (code points), keeping a short extension whole. */
function shorten(name: string, max: number): string {
  const chars = Array.from(name);
  if (chars.length <= max) return name;
  const extension = /\.[^.\s]{1,15}$/.exec(name)?.[0] ?? '';
  const keep = extension.length <= MAX_KEPT_EXTENSION ? extension : '';
  const stem = chars.slice(0, max - Array.from(keep).length).join('').trimEnd();
  return `${stem}${keep}`;
}

/** `name` plus `extension`, shortened (keeping the extension) to the longest kept name. */
export function appendExtension(name: string, extension: string): string {
  return shorten(`${name}${extension}`, MAX_FILE_NAME_LENGTH);
}

/**
 * The name to show and to download under: the last path segment only ("../../etc/passwd" becomes
 * "passwd", "C:\\data\\run 3.s2p" becomes "run 3.s2p"; look-alike slashes count as separators and
 * look-alike dots as dots), without control or invisible formatting characters, without leading dots
 * (no hidden files, no ".."), at most 200 characters. Returns "file" when nothing is left.
 */
export function sanitizeFileName(raw: string): string {
  const cleaned = raw
    .normalize('NFC')
    .replace(CONTROL_CHARACTERS, '')
    .replace(INVISIBLE_FORMATTING, '')
    .replace(LOOKALIKE_SEPARATORS, '/')
    .replace(LOOKALIKE_DOTS, '.');
  const lastSegment = cleaned.split(/[\\/]/).pop() ?? '';
  const name = lastSegment
    .replace(RESERVED_CHARACTERS, '_')
    .replace(/\s+/g, ' ')
    .replace(/^[.\s]+/, '')
    .replace(/[.\s]+$/, '');
  return name ? shorten(name, MAX_FILE_NAME_LENGTH) : 'file';
}

/** RFC 5987 attr-char excludes these, which encodeURIComponent leaves as they are. */
const encodeAttrValue = (value: string) =>
  encodeURIComponent(value).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);

/**
 * A Content-Disposition header value (RFC 6266): a plain-ASCII `filename` for old clients and the
 * exact name as `filename*` in UTF-8 (RFC 5987 / RFC 8187 encoding), which current browsers prefer.
 */
export function contentDisposition(type: 'inline' | 'attachment', fileName: string): string {
  const name = sanitizeFileName(fileName);
  const asciiFallback = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\%]/g, '_');
  return `${type}; filename="${asciiFallback}"; filename*=UTF-8''${encodeAttrValue(name)}`;
}
