/**
 * The one signature every pipe-end boundary condition has.
 *
 * A pipe end is described in OUTWARD coordinates: w is the gas velocity
 * leaving the pipe through that end (w = u at the right/valve end, w = −u at
 * the left/upstream end). The wave arriving at the end from inside carries
 * the Riemann invariant J = a + (γ−1)/2 · w, of gas with entropy level Ap.
 * Benson's non-homentropic correction is used at the end: gas of another
 * entropy level Ae at the end satisfies a_e + (γ−1)/2 · w_e = (J / Ap) · Ae,
 * so the pressure the incoming wave implies is continuous across a contact.
 *
 * A boundary reads `Incoming` and writes the end state `EndState` (no
 * allocation: it fills the object it is given). Both pipe schemes use the
 * same boundaries: the characteristics scheme takes the end node from it,
 * the conservative scheme takes the boundary face flux from it.
 */
export interface Incoming {
  /** incoming invariant J normalised by the pipe gas entropy level: J / Ap [-] */
  lambda: number;
  /** entropy level of the pipe gas arriving at the end [m/s] */
  entropy: number;
  /** flow area of the pipe end [m²] */
  area: number;
}

export interface EndState {
  /** static pressure at the end [Pa] */
  pressure: number;
  /** outward velocity [m/s] (positive leaving the pipe) */
  velocity: number;
  /** entropy level of the gas at the end [m/s] */
  entropy: number;
  /** outward mass flow ρ·w·F [kg/s] */
  massFlow: number;
  /** stagnation enthalpy flux leaving the pipe [W] (massFlow · h0 of the gas that moves) */
  enthalpyFlow: number;
  /** true when the pipe end or the restriction is choked */
  choked: boolean;
}

export interface Boundary {
  solve(inc: Incoming, out: EndState): void;
}

export function newEndState(): EndState {
  return { pressure: 0, velocity: 0, entropy: 0, massFlow: 0, enthalpyFlow: 0, choked: false };
}

/** A reservoir a pipe end opens to: ambient, plenum, cylinder, exhaust. */
export interface Reservoir {
  /** [Pa] */
  pressure: number;
  /** [K] */
  temperature: number;
}
