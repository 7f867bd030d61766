/**
 * Charts drawn on the server: Apache ECharts renders to an SVG string (its server-side mode),
 * so a page shows the chart with no client script at all, and prints as sharp vector art.
 * Only the pieces used here are registered (line and scatter charts, grid, legend, mark lines).
 * A scatter chart may carry a fitted line (`draw: 'line'`) and a guide line such as a wear limit.
 */
import * as echarts from 'echarts/core';
import { LineChart, ScatterChart } from 'echarts/charts';
import { GridComponent, LegendComponent, MarkLineComponent } from 'echarts/components';
import { SVGRenderer } from 'echarts/renderers';

echarts.use([LineChart, ScatterChart, GridComponent, LegendComponent, MarkLineComponent, SVGRenderer]);

/** Our palette (tailwind.config.mjs): iris for harvest loss, the crop amber for the machine's part. */
const IRIS = '#633cbd';
const AMBER = '#a35200';
const STEEL = '#536273';
const INK = '#1c2430';
const FONT = '"Source Sans 3", system-ui, sans-serif';

export interface SeriesPoint {
  x: number;
  y: number;
}

export interface ChartSeries {
  name: string;
  points: SeriesPoint[];
  /** 'iris' (default) or 'amber'. */
  tone?: 'iris' | 'amber';
  /** In a scatter chart: 'points' (default) or a plain 'line' through them (a fitted trend). */
  draw?: 'points' | 'line';
}

export interface ChartSpec {
  kind: 'time' | 'scatter';
  xName: string;
  yName: string;
  series: ChartSeries[];
  /** A dashed horizontal line, e.g. the loss target. */
  guide?: { y: number; label: string };
  /** The y axis's top (default: fitted to the data); set it so a guide above the data shows. */
  yMax?: number;
  width?: number;
  height?: number;
}

/** The chart as an SVG string (no scripts, no external references). */
export function chartSvg(spec: ChartSpec): string {
  const width = spec.width ?? 640;
  const height = spec.height ?? 300;
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width, height });
  try {
    chart.setOption({
      animation: false,
      textStyle: { fontFamily: FONT, color: INK, fontSize: 13 },
      grid: { left: 48, right: 16, top: spec.series.length > 1 ? 40 : 20, bottom: 52 },
      legend: spec.series.length > 1 ? { top: 4, textStyle: { fontFamily: FONT, color: INK } } : undefined,
      xAxis: {
        type: spec.kind === 'time' ? 'time' : 'value',
        name: spec.xName,
        nameLocation: 'middle',
        nameGap: 30,
        scale: spec.kind === 'scatter',
        axisLine: { lineStyle: { color: STEEL } },
        axisLabel: spec.kind === 'time' ? { color: INK, hideOverlap: true, formatter: '{d} {MMM}' } : { color: INK, hideOverlap: true },
      },
      yAxis: {
        type: 'value',
        name: spec.yName,
        nameLocation: 'middle',
        nameGap: 40,
        min: 0,
        max: spec.yMax,
        axisLine: { lineStyle: { color: STEEL } },
        axisLabel: { color: INK },
        splitLine: { lineStyle: { color: '#d3dae2' } },
      },
      series: spec.series.map((s, i) => ({
        name: s.name,
        type: spec.kind === 'time' || s.draw === 'line' ? 'line' : 'scatter',
        data: s.points.map((p) => [p.x, Math.round(p.y * 100) / 100]),
        color: s.tone === 'amber' ? AMBER : IRIS,
        symbol: s.draw === 'line' ? 'none' : s.tone === 'amber' ? 'triangle' : 'circle',
        symbolSize: spec.kind === 'time' ? 9 : 12,
        lineStyle: s.draw === 'line' ? { width: 2.5 } : s.tone === 'amber' ? { type: 'dashed', width: 2 } : { width: 3 },
        markLine:
          i === 0 && spec.guide
            ? {
                symbol: 'none',
                silent: true,
                lineStyle: { color: INK, type: [6, 4], width: 1.5 },
                label: { formatter: spec.guide.label, position: 'insideEndTop', color: INK, fontFamily: FONT },
                data: [{ yAxis: spec.guide.y }],
              }
            : undefined,
      })),
    });
    return chart.renderToSVGString();
  } finally {
    chart.dispose();
  }
}
