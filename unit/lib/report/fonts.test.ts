import { splitGreekText, renderChartSvg } from '../../../src/lib/report/chart-svg';
import { fileStem } from '../../../src/lib/report/notes';
import { textRuns } from '../../../src/lib/report/fonts';

/** Greek letters go to the Greek font file: Unicode's Greek and Coptic block is U+0370 to U+03FF. */

describe('textRuns', () => {
  it('cuts text into Latin and Greek runs, in order', () => {
    expect(textRuns('R (Ω) and η, 5 µH')).toEqual([
      { text: 'R (', greek: false },
      { text: 'Ω', greek: true },
      { text: ') and ', greek: false },
      { text: 'η', greek: true },
      // the micro sign U+00B5 is Latin-1, in the Latin file
      { text: ', 5 µH', greek: false },
    ]);
    expect(textRuns('')).toEqual([]);
  });
});

describe('chart SVG', () => {
  it('wraps Greek letters of a label in a tspan naming the Greek font', () => {
    const svg = '<svg><text x="1" style="font-family:Inter">R (Ω)</text><text>0.5</text></svg>';
    expect(splitGreekText(svg)).toBe('<svg><text x="1" style="font-family:Inter">R (<tspan font-family="InterGreek">Ω</tspan>)</text><text>0.5</text></svg>');
  });

  it('renders an ECharts option on the server as an SVG document of the asked size', () => {
    const svg = renderChartSvg({ animation: false, xAxis: { type: 'value', name: 'η' }, yAxis: { type: 'value' }, series: [{ type: 'line', data: [[0, 1], [1, 2]] }] }, 400, 300);
    expect(svg).toMatch(/^<svg[^>]*width="400" height="300"/);
    expect(svg).toContain('<tspan font-family="InterGreek">η</tspan>');
  });
});

describe('fileStem', () => {
  it('keeps ASCII letters, digits and dashes only', () => {
    expect(fileStem('Probe tilt × depth, "rig B" / Ω-load', 7)).toBe('couplet-probe-tilt-depth-rig-b-load');
    expect(fileStem('Café Ø 10 cm', 7)).toBe('couplet-cafe-10-cm');
  });

  it('falls back to the plan id when nothing is left', () => {
    expect(fileStem('Ωμη', 7)).toBe('couplet-plan-7');
  });
});
