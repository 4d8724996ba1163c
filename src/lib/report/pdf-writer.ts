import PDFDocument from 'pdfkit';
import SVGtoPDF from 'svg-to-pdfkit';
import { fontFor, FONT, registerReportFonts, textRuns, type TextRun } from './fonts';

/**
 * A small layout layer over pdfkit for the report: A4 pages, text in the embedded fonts (Latin and
 * Greek runs), headings, label/value lists, tables that repeat their header on a new page, and
 * SVG charts drawn as vectors. The report's content lives in pdf-sections.ts and pdf-quantity.ts.
 */

const MARGIN = 50;
const BOTTOM_MARGIN = 60;
/** ECharts measures in CSS pixels; PDF in points (1 px = 0.75 pt). */
export const PT_PER_PX = 0.75;

export const COLOUR = { ink: '#1e293b', muted: '#64748b', rule: '#cbd5e1', shade: '#f1f5f9', accent: '#217a7b' } as const;
export const BODY_SIZE = 9.5;
/** Extra space between wrapped lines [pt]. */
const LINE_GAP = 1.5;

export interface WriteOptions {
  bold?: boolean;
  size?: number;
  color?: string;
  /** place the text here instead of at the cursor */
  at?: { x: number; y: number };
  width?: number;
  align?: 'left' | 'right' | 'center';
  /** more text follows on the same line */
  continued?: boolean;
}

export interface TableColumn {
  title: string;
  /** share of the text width */
  share: number;
  align?: 'left' | 'right';
}

const CELL_PAD = 3;

export class PdfWriter {
  readonly doc: PDFKit.PDFDocument;
  private readonly chunks: Buffer[] = [];
  private readonly done: Promise<Buffer>;
  /** the last write asked to be continued on the same line */
  private continuing = false;

  constructor(info: { title: string; subject: string; createdAt: Date }) {
    this.doc = new PDFDocument({
      size: 'A4',
      margins: { top: MARGIN, bottom: BOTTOM_MARGIN, left: MARGIN, right: MARGIN },
      bufferPages: true,
      // no built-in font: pdfkit would load Helvetica's metrics, which cannot print Greek anyway
      font: null as unknown as string,
      lang: 'en',
      displayTitle: true,
      info: { Title: info.title, Subject: info.subject, Author: 'Couplet', Creator: 'Couplet', CreationDate: info.createdAt },
    });
    this.done = new Promise((resolve, reject) => {
      this.doc.on('data', (chunk: Buffer) => this.chunks.push(chunk));
      this.doc.on('end', () => resolve(Buffer.concat(this.chunks)));
      this.doc.on('error', reject);
    });
    registerReportFonts(this.doc);
    this.doc.font(FONT.regular).fontSize(BODY_SIZE).fillColor(COLOUR.ink);
  }

  get left(): number {
    return this.doc.page.margins.left;
  }

  get width(): number {
    return this.doc.page.width - this.doc.page.margins.left - this.doc.page.margins.right;
  }

  private get bottom(): number {
    return this.doc.page.height - this.doc.page.margins.bottom;
  }

  /** Starts a new page unless `height` points still fit below the cursor. */
  ensureSpace(height: number): void {
    if (this.doc.y + height > this.bottom) this.doc.addPage();
  }

  /** Text in Latin and Greek runs, wrapped to `width` (the text width by default). */
  write(text: string, options: WriteOptions = {}): void {
    const { doc } = this;
    const runs = textRuns(text);
    if (runs.length === 0) return;
    doc.fontSize(options.size ?? BODY_SIZE).fillColor(options.color ?? COLOUR.ink);
    const aligned = (options.align ?? 'left') !== 'left';
    if (runs.length > 1 && aligned && !this.continuing && this.placeLine(runs, options)) return;
    runs.forEach((run, i) => {
      doc.font(fontFor(run.greek, options.bold ?? false));
      const textOptions = {
        width: options.width ?? (options.at ? undefined : this.width),
        // several runs that need more than one line are wrapped from the left (see placeLine)
        align: runs.length > 1 ? 'left' : (options.align ?? 'left'),
        lineGap: LINE_GAP,
        continued: i < runs.length - 1 || (options.continued ?? false),
      };
      // text that continues a line must not be placed again, or pdfkit starts a new paragraph there
      if (i === 0 && !this.continuing) doc.text(run.text, options.at?.x ?? this.left, options.at?.y ?? doc.y, textOptions);
      else doc.text(run.text, textOptions);
    });
    this.continuing = options.continued ?? false;
  }

  /**
   * pdfkit centres or right-aligns each run of a continued line on its own, so a line of several runs
   * is placed here: measured run by run, then written from the left. False when it does not fit on one
   * line (it is then wrapped from the left).
   */
  private placeLine(runs: readonly TextRun[], options: WriteOptions): boolean {
    const { doc } = this;
    const bold = options.bold ?? false;
    const widths = runs.map((run) => doc.font(fontFor(run.greek, bold)).widthOfString(run.text));
    const total = widths.reduce((a, b) => a + b, 0);
    const x0 = options.at?.x ?? this.left;
    const y = options.at?.y ?? doc.y;
    const width = options.width ?? this.width;
    if (total > width) return false;
    let x = x0 + (width - total) * (options.align === 'center' ? 0.5 : 1);
    runs.forEach((run, i) => {
      doc.font(fontFor(run.greek, bold)).text(run.text, x, y, { lineBreak: false });
      x += widths[i];
    });
    doc.x = x0;
    doc.y = y + doc.currentLineHeight(true);
    return true;
  }

  /** Height of `text` wrapped to `width`, measured in the Latin face (Greek letters are about as wide). */
  heightOf(text: string, width: number, size = BODY_SIZE, bold = false): number {
    const { doc } = this;
    doc.font(bold ? FONT.bold : FONT.regular).fontSize(size);
    // one line needs no wrapping: measuring its width is a hundred times quicker, which big tables feel
    if (!text.includes('\n') && doc.widthOfString(text) <= width) return doc.currentLineHeight(true) + LINE_GAP;
    return doc.heightOfString(text, { width, lineGap: LINE_GAP });
  }

  heading(text: string, level: 1 | 2 | 3): void {
    const size = level === 1 ? 15 : level === 2 ? 12.5 : 10.5;
    // keep a heading with at least a few lines of what follows it
    this.ensureSpace(size * 2 + 60);
    this.doc.moveDown(level === 3 ? 0.4 : 0.8);
    this.write(text, { bold: true, size, color: level === 3 ? COLOUR.ink : COLOUR.accent });
    this.doc.moveDown(0.25);
  }

  paragraph(text: string, options: WriteOptions = {}): void {
    this.ensureSpace(this.heightOf(text, this.width, options.size));
    this.write(text, options);
    this.doc.moveDown(0.3);
  }

  /** Label and value pairs, the labels in a column of their own. */
  fields(rows: readonly (readonly [string, string])[], labelShare = 0.3): void {
    const labelWidth = this.width * labelShare;
    const valueWidth = this.width - labelWidth - 8;
    for (const [label, value] of rows) {
      const height = Math.max(this.heightOf(label, labelWidth), this.heightOf(value, valueWidth));
      this.ensureSpace(height);
      const y = this.doc.y;
      this.write(label, { at: { x: this.left, y }, width: labelWidth, color: COLOUR.muted });
      this.write(value, { at: { x: this.left + labelWidth + 8, y }, width: valueWidth });
      this.doc.x = this.left;
      this.doc.y = y + height + 2;
    }
    this.doc.moveDown(0.2);
  }

  private rowHeight(columns: readonly TableColumn[], cells: readonly string[], header: boolean, size: number): number {
    return Math.max(...cells.map((cell, i) => this.heightOf(cell, this.width * columns[i].share - 2 * CELL_PAD, size, header))) + 2 * CELL_PAD;
  }

  private tableRow(columns: readonly TableColumn[], cells: readonly string[], header: boolean, size: number, height: number): void {
    const y = this.doc.y;
    if (header) this.doc.rect(this.left, y, this.width, height).fill(COLOUR.shade);
    let x = this.left;
    cells.forEach((cell, i) => {
      const width = this.width * columns[i].share;
      if (cell !== '') this.write(cell, { at: { x: x + CELL_PAD, y: y + CELL_PAD }, width: width - 2 * CELL_PAD, size, bold: header, align: columns[i].align ?? 'left' });
      x += width;
    });
    this.doc.moveTo(this.left, y + height).lineTo(this.left + this.width, y + height).lineWidth(0.5).strokeColor(COLOUR.rule).stroke();
    this.doc.x = this.left;
    this.doc.y = y + height;
  }

  /** A table; on a new page its header row is repeated. */
  table(columns: readonly TableColumn[], rows: readonly (readonly string[])[], size = 8): void {
    const titles = columns.map((c) => c.title);
    const headerHeight = this.rowHeight(columns, titles, true, size);
    this.ensureSpace(headerHeight + 3 * size);
    this.tableRow(columns, titles, true, size, headerHeight);
    for (const row of rows) {
      const height = this.rowHeight(columns, row, false, size);
      if (this.doc.y + height > this.bottom) {
        this.doc.addPage();
        this.tableRow(columns, titles, true, size, headerHeight);
      }
      this.tableRow(columns, row, false, size, height);
    }
    this.doc.moveDown(0.6);
  }

  /** Draws an SVG (a chart) as vectors with its top left corner at (x, y), `widthPt` wide. */
  svg(svg: string, x: number, y: number, widthPt: number, heightPt: number): void {
    SVGtoPDF(this.doc, svg, x, y, {
      width: widthPt,
      height: heightPt,
      fontCallback: (family: string, bold: boolean) => fontFor(family.includes(FONT.greek), bold),
      warningCallback: () => undefined,
    });
    this.doc.font(FONT.regular).fontSize(BODY_SIZE).fillColor(COLOUR.ink);
  }

  /** Writes `footer(page, pages)` at the foot of every page, then closes the document. */
  finish(footer: (page: number, pages: number) => string): Promise<Buffer> {
    const { doc } = this;
    const range = doc.bufferedPageRange();
    for (let i = range.start; i < range.start + range.count; i++) {
      doc.switchToPage(i);
      const margin = doc.page.margins.bottom;
      // writing below the bottom margin would otherwise start a new page
      doc.page.margins.bottom = 0;
      this.write(footer(i - range.start + 1, range.count), {
        at: { x: this.left, y: doc.page.height - margin + 24 }, width: this.width, size: 7.5, color: COLOUR.muted, align: 'center',
      });
      doc.page.margins.bottom = margin;
    }
    doc.end();
    return this.done;
  }
}
