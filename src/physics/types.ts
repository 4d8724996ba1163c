/**
 * Request and response shapes of the coupling solver (PRODUCT.md, "POST /api/solve"). SI units throughout.
 */

export type Material = 'copper' | 'aluminium';

interface CoilCommon {
  /** overall wire (or bundle) diameter [m] */
  wireDiameter: number;
  material?: Material;
  /** conductor temperature [deg C], 20 by default */
  temperatureC?: number;
  /** number of strands of a stranded or litz conductor */
  strands?: number;
  /** diameter of one strand [m] */
  strandDiameter?: number;
  /** measured series resistance at the operating frequency [ohm]; overrides the model */
  resistance?: number;
}

/** One circle of `radius` [m] in z = 0, counter-clockwise seen from +z. */
export interface LoopSpec extends CoilCommon {
  kind: 'loop';
  radius: number;
}

/** `turns` right-handed turns of `radius` [m] from z = -length/2 to +length/2 [m], starting on +x. */
export interface HelixSpec extends CoilCommon {
  kind: 'helix';
  radius: number;
  turns: number;
  length: number;
}

/** Flat Archimedean spiral in z = 0 from innerRadius to outerRadius [m], counter-clockwise from +x. */
export interface SpiralSpec extends CoilCommon {
  kind: 'spiral';
  innerRadius: number;
  outerRadius: number;
  turns: number;
}

export type CoilSpec = LoopSpec | HelixSpec | SpiralSpec;

/** Receiver placement: tilt about local y, then centre at (lateralOffset, 0, distance) [m]. */
export interface TiltPlacement {
  distance: number;
  lateralOffset?: number;
  tiltDeg?: number;
}

/** Receiver pose: centre [m] and the direction its local +z axis is turned onto. */
export interface PosePlacement {
  center: [number, number, number];
  normal: [number, number, number];
}

export type Placement = TiltPlacement | PosePlacement;

export type Topology = 'SS' | 'SP' | 'PS' | 'PP';

export interface CircuitSpec {
  /** operating frequency [Hz] */
  frequency: number;
  /** first letter: transmitter capacitor in series (S) or parallel (P); second: receiver */
  topology: Topology;
  /** source open-circuit voltage [V rms] */
  sourceVoltage: number;
  /** source internal resistance [ohm] */
  sourceResistance: number;
  /** load resistance [ohm] */
  loadResistance: number;
  /** transmitter capacitor [F]; tuned to the frequency when absent */
  txCapacitance?: number;
  /** receiver capacitor [F]; tuned to the frequency when absent */
  rxCapacitance?: number;
}

export interface SolveRequest {
  transmitter: CoilSpec;
  receiver: CoilSpec;
  placement: Placement;
  circuit: CircuitSpec;
  /** requested relative tolerance of the quadratures, 1e-9..1e-2, 1e-6 by default */
  tolerance?: number;
}

export interface CoilResult {
  selfInductance: number;
  dcResistance: number;
  acResistance: number;
  wireLength: number;
  qualityFactor: number;
  capacitance: number;
  /** extras */
  tuned: boolean;
  resistanceSource: 'model' | 'measured';
  skinDepth: number;
  selfInductanceMethod: string;
}

export interface TransferResult {
  efficiency: number;
  loadPower: number;
  inputPower: number;
  txCurrent: number;
  rxCurrent: number;
  txCapacitorVoltage: number;
  rxCapacitorVoltage: number;
  figureOfMerit: number;
  optimalLoad: number;
  maxEfficiency: number;
  /** extras: power delivered by the ideal source [W], source current [A rms], load voltage [V rms] */
  sourcePower: number;
  sourceCurrent: number;
  loadVoltage: number;
}

export interface SolveResponse {
  mutualInductance: number;
  coupling: number;
  transmitter: CoilResult;
  receiver: CoilResult;
  transfer: TransferResult;
  accuracy: {
    /** largest estimated relative error of the three quadratures (M, L1, L2) */
    estimatedRelativeError: number;
    /** integrand evaluations of all three quadratures */
    integrandEvaluations: number;
    mutualInductance: { estimatedRelativeError: number; estimatedAbsoluteError: number; integrandEvaluations: number };
  };
  solverVersion: string;
}
