/**
 * Test oracle: Rac/Rdc of a round wire from Kelvin's ber/bei functions by their real power series
 * (Abramowitz & Stegun 9.9.10), with the classic form (e.g. Terman 1943; Ramo, Whinnery & Van Duzer)
 *   Rac/Rdc = (x/2) (ber x bei' x - bei x ber' x) / (ber'^2 x + bei'^2 x).
 * Independent of the solver's complex Bessel ratio. Valid here for x up to about 20.
 */
function kelvin(x: number): { ber: number; bei: number; dber: number; dbei: number } {
  let ber = 0, bei = 0, dber = 0, dbei = 0;
  const q = (x * x) / 4;
  // ber x = sum (-1)^k q^(2k) / ((2k)!)^2, bei x = sum (-1)^k q^(2k+1) / ((2k+1)!)^2
  let term = 1; // q^j / (j!)^2
  for (let j = 0; j < 200; j++) {
    if (j > 0) term *= q / (j * j);
    const sign = Math.floor(j / 2) % 2 === 0 ? 1 : -1;
    // d/dx of q^j = j q^(j-1) x / 2 = 2 j q^j / x
    const dterm = (2 * j * term) / x;
    if (j % 2 === 0) { ber += sign * term; dber += sign * dterm; } else { bei += sign * term; dbei += sign * dterm; }
    if (term < 1e-18 * Math.max(Math.abs(ber), Math.abs(bei), 1) && j > q) break;
  }
  return { ber, bei, dber, dbei };
}

export function kelvinRacOverRdc(x: number): number {
  const { ber, bei, dber, dbei } = kelvin(x);
  return ((x / 2) * (ber * dbei - bei * dber)) / (dber * dber + dbei * dbei);
}
