/**
 * Link efficiency with an extra series resistance in the receiver coil: the effective parameter that
 * soaks up losses the coil model does not carry (connectors, solder joints, capacitor ESR), fitted to
 * measured efficiencies.
 */
import { solveLink, type LinkParameters } from '../link-circuit';

/**
 * Link efficiency (load power over power into the transmitter terminals, as solveLink defines it) with
 * `extra` ohms added in series with the receiver coil (R2 + extra), everything else as in `link`.
 * Throws RangeError when `extra` is not finite or makes the receiver resistance negative.
 */
export function efficiencyWithExtraReceiverResistance(link: LinkParameters, extra: number): number {
  if (!Number.isFinite(extra)) throw new RangeError('extra receiver resistance must be a finite number');
  const R2 = link.R2 + extra;
  if (R2 < 0) throw new RangeError(`extra receiver resistance ${extra} ohm makes the receiver resistance negative`);
  return solveLink({ ...link, R2 }).efficiency;
}
