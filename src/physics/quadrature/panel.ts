/**
 * A panel [t0, t1] of a coil path, sampled for quadrature at a ladder of orders. A panel that is a whole
 * closed loop uses the periodic trapezoid rule, which converges geometrically for smooth periodic
 * integrands (Trefethen & Weideman, "The exponentially convergent trapezoidal rule", SIAM Review 56, 2014);
 * every other panel uses Gauss-Legendre.
 */
import type { CoilPath } from '../geometry/path';
import { gaussLegendre } from './gauss-legendre';

/** Doubles per node: x, y, z [m]; weighted tangent w dr/dt [m]; parameter t [rad]; speed |dr/dt| [m/rad]. */
export const NODE_STRIDE = 8;

/** Quadrature orders per panel, refined one step at a time (ratio about 1.3-1.5 per step). */
export const ORDERS = [4, 6, 8, 10, 12, 16, 20, 24, 32, 40, 48, 64] as const;
/** Extra orders for periodic whole-loop panels, whose uniform rule stays optimal for close loops. */
export const PERIODIC_ORDERS = [...ORDERS, 96, 128, 192, 256, 384, 512] as const;

export class Panel {
  readonly periodic: boolean;
  readonly maxLevel: number;
  private readonly samples: (Float64Array | undefined)[] = [];

  constructor(readonly path: CoilPath, readonly t0: number, readonly t1: number) {
    this.periodic = path.closed && t0 === 0 && t1 === path.tEnd;
    this.maxLevel = (this.periodic ? PERIODIC_ORDERS.length : ORDERS.length) - 1;
  }

  /** number of nodes at a level */
  order(level: number): number {
    return (this.periodic ? PERIODIC_ORDERS : ORDERS)[level];
  }

  /** Upper bound of the panel's arc length [m]. */
  arcLength(): number {
    return this.path.maxSpeed(this.t0, this.t1) * (this.t1 - this.t0);
  }

  /** The two halves of the panel in parameter. */
  split(): [Panel, Panel] {
    const tm = 0.5 * (this.t0 + this.t1);
    return [new Panel(this.path, this.t0, tm), new Panel(this.path, tm, this.t1)];
  }

  /** Nodes at a level, NODE_STRIDE doubles each, built once and cached. */
  nodes(level: number): Float64Array {
    const hit = this.samples[level];
    if (hit) return hit;
    const n = this.order(level);
    const out = new Float64Array(n * NODE_STRIDE);
    const h = this.t1 - this.t0;
    const gl = this.periodic ? undefined : gaussLegendre(n);
    for (let i = 0; i < n; i++) {
      const t = gl ? this.t0 + 0.5 * h * (gl.nodes[i] + 1) : this.t0 + (h * i) / n;
      const w = gl ? 0.5 * h * gl.weights[i] : h / n;
      const o = i * NODE_STRIDE;
      this.path.evaluate(t, out, o);
      const speed = Math.sqrt(out[o + 3] * out[o + 3] + out[o + 4] * out[o + 4] + out[o + 5] * out[o + 5]);
      out[o + 3] *= w;
      out[o + 4] *= w;
      out[o + 5] *= w;
      out[o + 6] = t;
      out[o + 7] = speed;
    }
    this.samples[level] = out;
    return out;
  }
}
