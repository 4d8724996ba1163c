import { appendExtension, attachmentObjectKey, contentDisposition, MAX_FILE_NAME_LENGTH, sanitizeFileName } from '../../../src/lib/storage/object-keys';

describe('attachment object keys', () => {
  it('are studies/<studyId>/plans/<planId>/<uuid v4>, new on every call', () => {
    const key = attachmentObjectKey(3, 17);
    expect(key).toMatch(/^studies\/3\/plans\/17\/[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(attachmentObjectKey(3, 17)).not.toBe(key);
  });

  it('refuse ids that are not positive whole numbers', () => {
    for (const bad of [0, -1, 1.5, Number.NaN, Number.MAX_SAFE_INTEGER + 1]) {
      expect(() => attachmentObjectKey(bad, 1)).toThrow(RangeError);
      expect(() => attachmentObjectKey(1, bad)).toThrow(RangeError);
    }
  });
});

describe('sanitizeFileName', () => {
  it('keeps only the last path segment, so ../ and drive paths cannot climb out', () => {
    expect(sanitizeFileName('../../etc/passwd')).toBe('passwd');
    expect(sanitizeFileName('..\\..\\Windows\\System32\\cmd.exe')).toBe('cmd.exe');
    expect(sanitizeFileName('C:\\bench\\run 3.s2p')).toBe('run 3.s2p');
    expect(sanitizeFileName('/abs/path/photo.jpg')).toBe('photo.jpg');
    // An encoded slash is not a path separator here (names are never decoded), only its leading dots go.
    expect(sanitizeFileName('..%2F..%2Fetc')).toBe('%2F..%2Fetc');
  });

  it('counts look-alike slashes as separators and look-alike dots as dots (Unicode code charts: U+2044, U+2215, U+FF0F, U+FF3C, U+2024, U+FF0E)', () => {
    expect(sanitizeFileName('\u2024\u2024\u2215\u2024\u2024\u2215studies\u22152\u2215x.s2p')).toBe('x.s2p');
    expect(sanitizeFileName('\uff0e\uff0e\uff0f\uff0e\uff0e\uff0fx.s2p')).toBe('x.s2p');
    expect(sanitizeFileName('..\uff3c..\u2044run 3.s2p')).toBe('run 3.s2p');
    expect(sanitizeFileName('\uff0ehidden')).toBe('hidden');
  });

  it('leaves nothing that is only dots, slashes or blanks; falls back to "file"', () => {
    for (const raw of ['', '..', '.', '../', '..\\..\\', '   ', '\u0000\u0001', '/']) expect(sanitizeFileName(raw)).toBe('file');
  });

  it('drops leading dots (no hidden files) and trailing dots and blanks', () => {
    expect(sanitizeFileName('.htaccess')).toBe('htaccess');
    expect(sanitizeFileName('...profile.txt. . ')).toBe('profile.txt');
  });

  it('removes control characters, so a name cannot break a header or a log line', () => {
    expect(sanitizeFileName('a\u0000b\r\nSet-Cookie: x=1.csv')).toBe('abSet-Cookie_ x=1.csv');
    expect(sanitizeFileName('tab\there\u007f.txt')).toBe('tabhere.txt');
  });

  it('removes bidirectional overrides that disguise an extension ("gpj.exe" shown reversed)', () => {
    expect(sanitizeFileName('photo\u202Egpj.exe')).toBe('photogpj.exe');
    expect(sanitizeFileName('zero\u200Bwidth.png')).toBe('zerowidth.png');
  });

  it('replaces characters Windows refuses and collapses runs of blanks', () => {
    expect(sanitizeFileName('run:1 <ok>?  "final"|*.s2p')).toBe('run_1 _ok__ _final___.s2p');
  });

  it('keeps letters of any script and composes them (NFC)', () => {
    expect(sanitizeFileName('Messung Ø 5 cm – Spule.csv')).toBe('Messung Ø 5 cm – Spule.csv');
    expect(sanitizeFileName('Mu\u0308ller.txt')).toBe('Müller.txt');
  });

  it('limits names to 200 characters, counting code points and keeping the extension', () => {
    const long = sanitizeFileName(`${'a'.repeat(300)}.s2p`);
    expect(Array.from(long)).toHaveLength(MAX_FILE_NAME_LENGTH);
    expect(long.endsWith('.s2p')).toBe(true);
    const emoji = sanitizeFileName(`${'🧲'.repeat(250)}.jpg`);
    expect(Array.from(emoji)).toHaveLength(MAX_FILE_NAME_LENGTH);
    expect(emoji.endsWith('.jpg')).toBe(true);
    expect(Array.from(appendExtension('b'.repeat(200), '.txt'))).toHaveLength(MAX_FILE_NAME_LENGTH);
    expect(appendExtension('b'.repeat(200), '.txt').endsWith('.txt')).toBe(true);
  });
});

describe('contentDisposition (RFC 6266 with an RFC 5987 filename*)', () => {
  it('gives an ASCII fallback and the exact UTF-8 name, percent-encoded', () => {
    expect(contentDisposition('attachment', 'Messung Ø 5 cm.csv')).toBe(
      `attachment; filename="Messung _ 5 cm.csv"; filename*=UTF-8''Messung%20%C3%98%205%20cm.csv`,
    );
    expect(contentDisposition('inline', 'bench.jpg')).toBe(`inline; filename="bench.jpg"; filename*=UTF-8''bench.jpg`);
  });

  it('encodes the characters attr-char excludes but encodeURIComponent keeps', () => {
    expect(contentDisposition('attachment', "probe's (2)*.csv")).toBe(
      `attachment; filename="probe's (2)_.csv"; filename*=UTF-8''probe%27s%20%282%29_.csv`,
    );
  });

  it('cannot be broken out of: quotes, backslashes, CR/LF and paths are gone', () => {
    const value = contentDisposition('attachment', '..\\a"b\r\nX-Evil: 1\\c%41.txt');
    expect(value).not.toMatch(/[\r\n]/);
    expect(value).toBe(`attachment; filename="c_41.txt"; filename*=UTF-8''c%2541.txt`);
  });
});
