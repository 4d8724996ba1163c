'use client';

import { CustomChart, HeatmapChart, LineChart, ScatterChart } from 'echarts/charts';
import { GridComponent, LegendComponent, TooltipComponent, VisualMapComponent } from 'echarts/components';
import * as echarts from 'echarts/core';
import { CanvasRenderer, SVGRenderer } from 'echarts/renderers';
import { useEffect, useRef } from 'react';
import { Button } from '@/components/ui/button';

// Only what the plan and review charts use (scatter for readings, custom for error bars and bands), so
// the bundle stays small; this module loads only on plan pages.
echarts.use([LineChart, HeatmapChart, ScatterChart, CustomChart, GridComponent, TooltipComponent, LegendComponent, VisualMapComponent, CanvasRenderer, SVGRenderer]);

export type ChartOption = echarts.EChartsCoreOption;

const HEIGHT = 380;
/** Exported PNGs at twice the screen's pixels, for slides and papers. */
const PNG_PIXEL_RATIO = 2;

function download(href: string, filename: string) {
  const link = document.createElement('a');
  link.href = href;
  link.download = filename;
  document.body.appendChild(link);
  link.click();
  link.remove();
}

/**
 * One ECharts chart on a canvas, with PNG and SVG export. The SVG comes from a second instance with
 * the SVG renderer, rendered off-screen at the same size, so the export is vector, not a traced bitmap.
 */
export function EChart({ option, label, filename }: { option: ChartOption; label: string; filename: string }) {
  const box = useRef<HTMLDivElement>(null);
  const chart = useRef<echarts.ECharts | null>(null);

  useEffect(() => {
    if (!box.current) return;
    const instance = echarts.init(box.current, null, { renderer: 'canvas' });
    chart.current = instance;
    const resize = () => instance.resize();
    window.addEventListener('resize', resize);
    return () => {
      window.removeEventListener('resize', resize);
      instance.dispose();
      chart.current = null;
    };
  }, []);

  useEffect(() => {
    chart.current?.setOption(option, { notMerge: true });
  }, [option]);

  const exportPng = () => {
    if (!chart.current) return;
    download(chart.current.getDataURL({ type: 'png', pixelRatio: PNG_PIXEL_RATIO, backgroundColor: '#ffffff' }), `${filename}.png`);
  };

  const exportSvg = () => {
    const width = box.current?.clientWidth ?? 800;
    const svgChart = echarts.init(null, null, { renderer: 'svg', ssr: true, width, height: HEIGHT });
    svgChart.setOption({ ...option, animation: false, backgroundColor: '#ffffff' });
    const svg = svgChart.renderToSVGString();
    svgChart.dispose();
    const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
    download(url, `${filename}.svg`);
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };

  return (
    <div>
      <div ref={box} role="img" aria-label={label} style={{ height: HEIGHT }} className="w-full" />
      <div className="mt-2 flex gap-2">
        <Button size="sm" onClick={exportPng}>
          Export PNG
        </Button>
        <Button size="sm" onClick={exportSvg}>
          Export SVG
        </Button>
      </div>
    </div>
  );
}
