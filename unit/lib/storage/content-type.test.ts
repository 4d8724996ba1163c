import { checkAttachmentContent, decodeText, MAX_ATTACHMENT_BYTES, sniffBinaryType, textType } from '../../../src/lib/storage/content-type';
import { HttpError } from '../../../src/lib/http/errors';

/**
 * Real leading bytes of each format, written out from the format specifications (not from the code
 * under test). Section numbers other than PNG's are recalled from memory.
 */
// PNG specification (W3C / ISO/IEC 15948), section 5.2 "PNG signature": 137 80 78 71 13 10 26 10.
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
// A complete 1x1 PNG (signature, IHDR, IDAT, IEND), the common smallest-PNG example.
const PNG_1X1 = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');
// JPEG (ITU-T T.81 Annex B): SOI = FF D8, then an APP0 "JFIF" segment (JFIF 1.02), then EOI = FF D9.
const JPEG = Buffer.from([
  0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x02, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00, 0xff, 0xd9,
]);
// WebP (RFC 9649): "RIFF", little-endian file size - 8, "WEBP", then a chunk ("VP8L", size, data).
function webp(): Buffer {
  const chunk = Buffer.concat([Buffer.from('VP8L'), Buffer.from([0x05, 0, 0, 0]), Buffer.from([0x2f, 0, 0, 0, 0]), Buffer.from([0])]);
  const size = Buffer.alloc(4);
  size.writeUInt32LE(4 + chunk.length);
  return Buffer.concat([Buffer.from('RIFF'), size, Buffer.from('WEBP'), chunk]);
}
// PDF (ISO 32000-1, 7.5.2): "%PDF-1.7", then a comment line of bytes above 127 marking binary content.
const PDF = Buffer.concat([Buffer.from('%PDF-1.7\n%'), Buffer.from([0xe2, 0xe3, 0xcf, 0xd3]), Buffer.from('\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n')]);
// A Windows executable: the DOS header starts with "MZ" (4D 5A) and holds NUL bytes.
const EXE = Buffer.concat([Buffer.from('MZ'), Buffer.from([0x90, 0x00, 0x03, 0x00, 0x00, 0x00, 0x04, 0x00]), Buffer.alloc(56), Buffer.from('PE\0\0')]);
// GIF89a: a real image format we do not accept for photos.
const GIF = Buffer.from('GIF89a\x01\x00\x01\x00\x00\x00\x00;', 'latin1');
// Touchstone v1 two-port file: option line "# <freq unit> S <format> R <ref>", then frequency and 4 pairs.
const TOUCHSTONE = Buffer.from('! VNA export\n# MHz S RI R 50\n6.78 0.10 -0.20 0.80 0.05 0.80 0.05 0.12 -0.18\n6.80 0.11 -0.19 0.79 0.06 0.79 0.06 0.12 -0.17\n');
const CSV = Buffer.from('distance_m,voltage_V\n0.12,3.4\n0.14,2.9\n');

/** The status and field paths of the HttpError `action` throws. */
function refusal(action: () => unknown): { status: number; paths: string[]; message: string } {
  try {
    action();
  } catch (error) {
    if (!(error instanceof HttpError)) throw error;
    return { status: error.status, paths: error.issues.map((i) => i.path), message: error.message };
  }
  throw new Error('expected a refusal');
}

describe('content sniffing', () => {
  it('the PNG fixture starts with the signature of PNG spec 5.2', () => {
    expect([...PNG_1X1.subarray(0, 8)]).toEqual(PNG_SIGNATURE);
  });

  it('recognises JPEG, PNG, WebP and PDF by their leading bytes', () => {
    expect(sniffBinaryType(JPEG)).toBe('image/jpeg');
    expect(sniffBinaryType(PNG_1X1)).toBe('image/png');
    expect(sniffBinaryType(webp())).toBe('image/webp');
    expect(sniffBinaryType(PDF)).toBe('application/pdf');
  });

  it('recognises nothing else: executables, GIF, a RIFF that is not WebP (WAVE), truncated signatures', () => {
    expect(sniffBinaryType(EXE)).toBeNull();
    expect(sniffBinaryType(GIF)).toBeNull();
    const wave = Buffer.concat([Buffer.from('RIFF'), Buffer.from([4, 0, 0, 0]), Buffer.from('WAVE')]);
    expect(sniffBinaryType(wave)).toBeNull();
    expect(sniffBinaryType(PNG_1X1.subarray(0, 7))).toBeNull();
    expect(sniffBinaryType(Buffer.from('%PD'))).toBeNull();
  });

  it('takes valid UTF-8 without binary control characters as text', () => {
    expect(decodeText(Buffer.from('Spule Ø 12 cm\tok\r\n'))).toBe('Spule Ø 12 cm\tok\r\n');
    expect(decodeText(Buffer.from([0x61, 0x00, 0x62]))).toBeNull(); // NUL
    expect(decodeText(Buffer.from([0x61, 0xc3, 0x28]))).toBeNull(); // invalid UTF-8 continuation byte
    expect(decodeText(Buffer.from([0x61, 0x1b, 0x5b, 0x6d]))).toBeNull(); // ESC
  });

  it('names CSV by extension or by a steady comma count; Touchstone and .txt stay text/plain', () => {
    expect(textType('a;b\n1;2\n', 'run.csv')).toBe('text/csv');
    expect(textType(CSV.toString(), 'export')).toBe('text/csv');
    expect(textType(CSV.toString(), 'notes.txt')).toBe('text/plain');
    expect(textType(TOUCHSTONE.toString(), 'pad.s2p')).toBe('text/plain');
    expect(textType('free text, with one comma\nand none here\n', 'notes')).toBe('text/plain');
  });
});

describe('checkAttachmentContent', () => {
  it('accepts photos of the three raster types and keeps a matching name', () => {
    expect(checkAttachmentContent('photo', JPEG, 'bench.jpeg')).toEqual({ contentType: 'image/jpeg', fileName: 'bench.jpeg' });
    expect(checkAttachmentContent('photo', PNG_1X1, 'bench.png')).toEqual({ contentType: 'image/png', fileName: 'bench.png' });
    expect(checkAttachmentContent('photo', webp(), 'bench.webp')).toEqual({ contentType: 'image/webp', fileName: 'bench.webp' });
  });

  it('types by content, not by name: a PNG called .jpg is a PNG and gets the PNG extension', () => {
    expect(checkAttachmentContent('photo', PNG_1X1, 'bench.jpg')).toEqual({ contentType: 'image/png', fileName: 'bench.jpg.png' });
  });

  it('refuses an .exe renamed .jpg, a GIF and an SVG as a photo (415 at file)', () => {
    expect(refusal(() => checkAttachmentContent('photo', EXE, 'holiday.jpg'))).toMatchObject({ status: 415, paths: ['file'] });
    expect(refusal(() => checkAttachmentContent('photo', GIF, 'probe.gif'))).toMatchObject({ status: 415, paths: ['file'] });
    const svg = refusal(() => checkAttachmentContent('photo', Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>'), 'a.svg'));
    expect(svg).toMatchObject({ status: 415, paths: ['file'] });
    expect(svg.message).toContain('instrument file');
  });

  it('accepts PDF, Touchstone and CSV instrument files', () => {
    expect(checkAttachmentContent('instrument', PDF, 'report.pdf')).toEqual({ contentType: 'application/pdf', fileName: 'report.pdf' });
    expect(checkAttachmentContent('instrument', TOUCHSTONE, 'pad.s2p')).toEqual({ contentType: 'text/plain', fileName: 'pad.s2p' });
    expect(checkAttachmentContent('instrument', TOUCHSTONE, 'rx.S1P')).toEqual({ contentType: 'text/plain', fileName: 'rx.S1P' });
    expect(checkAttachmentContent('instrument', CSV, 'sweep.csv')).toEqual({ contentType: 'text/csv', fileName: 'sweep.csv' });
  });

  it('gives text under a program name a text extension, so it never opens as a program', () => {
    expect(checkAttachmentContent('instrument', Buffer.from('echo hi\r\n'), 'run.bat').fileName).toBe('run.bat.txt');
    expect(checkAttachmentContent('instrument', CSV, 'sweep.exe')).toEqual({ contentType: 'text/csv', fileName: 'sweep.exe.csv' });
  });

  it('refuses executables, binary data and pictures as instrument files (415 at file)', () => {
    expect(refusal(() => checkAttachmentContent('instrument', EXE, 'scope.s2p'))).toMatchObject({ status: 415, paths: ['file'] });
    expect(refusal(() => checkAttachmentContent('instrument', Buffer.from([0xc3, 0x28, 0x41]), 'x.txt'))).toMatchObject({ status: 415, paths: ['file'] });
    const png = refusal(() => checkAttachmentContent('instrument', PNG_1X1, 'scope.png'));
    expect(png).toMatchObject({ status: 415, paths: ['file'] });
    expect(png.message).toContain('photo');
  });

  it('refuses an empty file (422) and files over 15 MB (photo) or 10 MB (instrument) (413), at file', () => {
    expect(refusal(() => checkAttachmentContent('photo', Buffer.alloc(0), 'a.jpg'))).toMatchObject({ status: 422, paths: ['file'] });
    const photoAtLimit = Buffer.concat([JPEG, Buffer.alloc(MAX_ATTACHMENT_BYTES.photo - JPEG.length)]);
    expect(checkAttachmentContent('photo', photoAtLimit, 'big.jpg').contentType).toBe('image/jpeg');
    const photoOver = Buffer.concat([photoAtLimit, Buffer.from([0])]);
    expect(refusal(() => checkAttachmentContent('photo', photoOver, 'big.jpg'))).toMatchObject({ status: 413, paths: ['file'], message: 'A photo can be at most 15 MB.' });
    const textOver = Buffer.alloc(MAX_ATTACHMENT_BYTES.instrument + 1, 0x31);
    expect(refusal(() => checkAttachmentContent('instrument', textOver, 'big.csv'))).toMatchObject({ status: 413, paths: ['file'], message: 'An instrument file can be at most 10 MB.' });
    expect(MAX_ATTACHMENT_BYTES).toEqual({ photo: 15 * 1024 * 1024, instrument: 10 * 1024 * 1024 });
  });
});
