/**
 * ECharts custom series the review draws on screen and in the PDF alike: ±1 u error bars with caps,
 * and filled bands (the parity plot's ±5 % and ±10 %, the residual tolerance). Pure option builders, so
 * the browser and the server's SVG rendering share them.
 */

type Api = { value: (dim: number) => number; coord: (point: [number, number]) => [number, number] };

export interface BarStyle {
  /** half-width of the caps [px] */
  cap: number;
  lineWidth: number;
}

/** Vertical bars from [x, low, high] rows, with short caps at both ends. */
export function errorBarSeries(name: string, colour: string, bars: [number, number, number][], { cap, lineWidth }: BarStyle): Record<string, unknown> {
  return {
    type: 'custom',
    name,
    color: colour,
    silent: true,
    z: 3,
    data: bars,
    encode: { x: 0, y: [1, 2] },
    renderItem: (_params: unknown, api: Api) => {
      const top = api.coord([api.value(0), api.value(2)]);
      const bottom = api.coord([api.value(0), api.value(1)]);
      const style = { stroke: colour, lineWidth };
      return {
        type: 'group',
        children: [
          { type: 'line', shape: { x1: top[0], y1: top[1], x2: bottom[0], y2: bottom[1] }, style },
          { type: 'line', shape: { x1: top[0] - cap, y1: top[1], x2: top[0] + cap, y2: top[1] }, style },
          { type: 'line', shape: { x1: bottom[0] - cap, y1: bottom[1], x2: bottom[0] + cap, y2: bottom[1] }, style },
        ],
      };
    },
  };
}

/**
 * A filled polygon in data coordinates, drawn behind the points and not interactive. The data only
 * widens the axes to the polygon's box; the drawing uses the corners themselves, and what lies outside
 * the plot area is cut off.
 */
export function polygonSeries(name: string, polygon: [number, number][], fill: string, opacity = 1): Record<string, unknown> {
  const xs = polygon.map((p) => p[0]);
  const ys = polygon.map((p) => p[1]);
  return {
    type: 'custom',
    name,
    silent: true,
    clip: true,
    z: 0,
    itemStyle: { color: fill, opacity },
    data: [[Math.min(...xs), Math.min(...ys), Math.max(...xs), Math.max(...ys)]],
    encode: { x: [0, 2], y: [1, 3] },
    renderItem: (_params: unknown, api: Api) => ({
      type: 'polygon',
      shape: { points: polygon.map((p) => api.coord(p)) },
      style: { fill, opacity },
    }),
  };
}
