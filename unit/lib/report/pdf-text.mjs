// Prints the text of a PDF file as JSON (one string per page), using pdf.js as an independent reader.
// Run by node from the report tests: jest runs CommonJS, and pdf.js ships only as ES modules.
//   node unit/lib/report/pdf-text.mjs file.pdf
import fs from 'node:fs';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';

const data = new Uint8Array(fs.readFileSync(process.argv[2]));
const pdf = await getDocument({ data, isEvalSupported: false, useSystemFonts: false }).promise;
const pages = [];
for (let n = 1; n <= pdf.numPages; n++) {
  const content = await (await pdf.getPage(n)).getTextContent();
  pages.push(content.items.map((item) => ('str' in item ? item.str + (item.hasEOL ? '\n' : '') : '')).join(''));
}
process.stdout.write(JSON.stringify({ pages, info: (await pdf.getMetadata()).info }));
