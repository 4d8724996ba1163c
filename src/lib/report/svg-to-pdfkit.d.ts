/** svg-to-pdfkit 0.1.8 ships no types; this is the part of its API the report uses (its README). */
declare module 'svg-to-pdfkit' {
  interface SvgToPdfOptions {
    /** drawing size in points; the SVG is scaled to fit, keeping its aspect ratio */
    width?: number;
    height?: number;
    preserveAspectRatio?: string;
    /** the pdfkit font name to use for an SVG font-family */
    fontCallback?: (family: string, bold: boolean, italic: boolean, fontOptions: { fauxItalic: boolean; fauxBold: boolean }) => string;
    warningCallback?: (message: string) => void;
    /** treat SVG units as points instead of CSS pixels */
    assumePt?: boolean;
    precision?: number;
  }

  function SVGtoPDF(doc: PDFKit.PDFDocument, svg: string, x?: number, y?: number, options?: SvgToPdfOptions): void;
  export = SVGtoPDF;
}
