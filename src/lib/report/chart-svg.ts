import * as echarts from 'echarts';
import { FONT, textRuns } from './fonts';

/**
 * Charts as SVG text, rendered on the server by ECharts (server-side rendering, no DOM), for the PDF
 * to draw as vectors. The full build is imported: its CommonJS bundle loads in jest and in Node alike
 * (the tree-shakable 'echarts/core' entry is ES modules only), and the server has no bundle size to save.
 */

const TEXT_ELEMENT = /(<text\b[^>]*>)([^<]*)(<\/text>)/g;

/**
 * ECharts writes each label as one <text>; the PDF's fonts hold Latin and Greek in separate files,
 * so Greek letters ("η", "Ω") go into a <tspan> naming the Greek file, which svg-to-pdfkit honours.
 */
export function splitGreekText(svg: string): string {
  return svg.replace(TEXT_ELEMENT, (whole, open: string, content: string, close: string) => {
    const runs = textRuns(content);
    if (!runs.some((r) => r.greek)) return whole;
    const inner = runs.map((r) => (r.greek ? `<tspan font-family="${FONT.greek}">${r.text}</tspan>` : r.text)).join('');
    return `${open}${inner}${close}`;
  });
}

/** One chart as an SVG document of `widthPx` x `heightPx`. */
export function renderChartSvg(option: echarts.EChartsCoreOption, widthPx: number, heightPx: number): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width: widthPx, height: heightPx });
  try {
    chart.setOption(option);
    return splitGreekText(chart.renderToSVGString());
  } finally {
    chart.dispose();
  }
}
