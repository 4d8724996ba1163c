/**
 * A coil's wire axis as a parametric curve r(t) in world coordinates, t in [0, tEnd] radians of
 * winding angle. Every quadrature (Neumann, Biot-Savart) and the 3D bench sample this same curve.
 */
export interface CoilPath {
  /** end of the parameter range [rad]; the start is 0 */
  readonly tEnd: number;
  /** true when r(tEnd) = r(0) with matching tangents, so the periodic trapezoid rule applies */
  readonly closed: boolean;
  /** number of base panels: one per (started) turn */
  readonly panelCount: number;
  /** wire radius [m] */
  readonly wireRadius: number;
  /** arc length of the whole path [m] */
  readonly length: number;
  /** a lower bound of the speed |dr/dt| over the whole path [m/rad] */
  readonly minSpeed: number;
  /** smallest radius of curvature along the path [m] */
  readonly minCurvatureRadius: number;
  /** write position [m] and derivative dr/dt [m/rad] at t into out[o..o+5] */
  evaluate(t: number, out: Float64Array, o: number): void;
  /** an upper bound of the speed |dr/dt| on [t0, t1] [m/rad] */
  maxSpeed(t0: number, t1: number): number;
}
