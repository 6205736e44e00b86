/**
 * Exact Riemann solver for the 1-D Euler equations of an ideal gas, after
 * Toro, Riemann Solvers and Numerical Methods for Fluid Dynamics, 3rd ed.
 * (2009), chapter 4. A pure function of the two states: the tests check the
 * solvers against it, and `tractwave pipe` prints it beside a shock tube.
 *
 * Problem: ∂U/∂t + ∂F(U)/∂x = 0, U = (ρ, ρu, E), E = p/(γ−1) + ρu²/2, with
 * the piecewise constant data W_L = (ρ_L, u_L, p_L) for x < 0 and
 * W_R = (ρ_R, u_R, p_R) for x > 0 at t = 0.
 *
 * Symbols: ρ density, u velocity, p pressure, γ ratio of specific heats,
 * a = √(γp/ρ) sound speed; p*, u* pressure and velocity of the star region
 * between the left and right waves; ρ*L, ρ*R star densities either side of
 * the contact; s = x/t the similarity variable.
 *
 * p* is the root of f(p) = f_L(p) + f_R(p) + (u_R − u_L) = 0 (Toro eq. 4.5),
 *   f_K(p) = (p − p_K)·√(A_K/(p + B_K))                  p > p_K (shock)
 *   f_K(p) = 2a_K/(γ−1)·((p/p_K)^((γ−1)/(2γ)) − 1)       p ≤ p_K (rarefaction)
 *   A_K = 2/((γ+1)ρ_K), B_K = (γ−1)/(γ+1)·p_K          (Toro eqs. 4.6–4.7)
 * found by Newton iteration from the adaptive initial guess of Toro §4.3.2
 * (PVRS, two-rarefaction or two-shock); u* = ½(u_L + u_R) + ½(f_R − f_L)
 * (Toro eq. 4.9). The solution is sampled at s as in Toro §4.5.
 */

export interface GasState {
  /** density [kg/m³] (or any consistent unit) */
  rho: number;
  /** velocity [m/s] */
  u: number;
  /** pressure [Pa] */
  p: number;
}

export interface RiemannSolution {
  gamma: number;
  left: GasState;
  right: GasState;
  pStar: number;
  uStar: number;
  /** star density left of the contact */
  rhoStarL: number;
  /** star density right of the contact */
  rhoStarR: number;
  /** true when the left wave is a shock (otherwise a rarefaction) */
  leftShock: boolean;
  rightShock: boolean;
  /** Newton iterations used */
  iterations: number;
}

function sound(s: GasState, g: number): number {
  return Math.sqrt((g * s.p) / s.rho);
}

/** f_K(p) and its derivative (Toro eqs. 4.6, 4.7, 4.37) */
function pressureFunction(p: number, s: GasState, g: number): { f: number; df: number } {
  const a = sound(s, g);
  if (p > s.p) {
    const A = 2 / ((g + 1) * s.rho);
    const B = ((g - 1) / (g + 1)) * s.p;
    const q = Math.sqrt(A / (p + B));
    return { f: (p - s.p) * q, df: q * (1 - (p - s.p) / (2 * (B + p))) };
  }
  const pr = p / s.p;
  return {
    f: ((2 * a) / (g - 1)) * (Math.pow(pr, (g - 1) / (2 * g)) - 1),
    df: (1 / (s.rho * a)) * Math.pow(pr, -(g + 1) / (2 * g)),
  };
}

/** adaptive initial guess for p* (Toro §4.3.2, eqs. 4.46–4.48) */
function initialGuess(l: GasState, r: GasState, g: number): number {
  const aL = sound(l, g);
  const aR = sound(r, g);
  const pMin = Math.min(l.p, r.p);
  const pMax = Math.max(l.p, r.p);
  const ppv = Math.max(0, 0.5 * (l.p + r.p) - 0.125 * (r.u - l.u) * (l.rho + r.rho) * (aL + aR));
  if (pMax / pMin < 2 && ppv >= pMin && ppv <= pMax) return ppv;
  if (ppv < pMin) {
    const z = (g - 1) / (2 * g);
    const num = aL + aR - ((g - 1) / 2) * (r.u - l.u);
    const den = aL / Math.pow(l.p, z) + aR / Math.pow(r.p, z);
    return Math.pow(num / den, 1 / z);
  }
  const gL = Math.sqrt(2 / ((g + 1) * l.rho) / (ppv + ((g - 1) / (g + 1)) * l.p));
  const gR = Math.sqrt(2 / ((g + 1) * r.rho) / (ppv + ((g - 1) / (g + 1)) * r.p));
  return Math.max(1e-300, (gL * l.p + gR * r.p - (r.u - l.u)) / (gL + gR));
}

/** Solve the Riemann problem (Toro 2009 §4.3). Throws when the data generate vacuum. */
export function solveRiemann(left: GasState, right: GasState, gamma = 1.4): RiemannSolution {
  const g = gamma;
  const aL = sound(left, g);
  const aR = sound(right, g);
  // pressure positivity condition (Toro eq. 4.40)
  if ((2 / (g - 1)) * (aL + aR) <= right.u - left.u) {
    throw new Error('Riemann data generate vacuum');
  }
  let p = initialGuess(left, right, g);
  let iterations = 0;
  for (; iterations < 100; iterations++) {
    const fl = pressureFunction(p, left, g);
    const fr = pressureFunction(p, right, g);
    let next = p - (fl.f + fr.f + right.u - left.u) / (fl.df + fr.df);
    if (next <= 0) next = 1e-8 * p;
    const change = (2 * Math.abs(next - p)) / (next + p);
    p = next;
    if (change < 1e-14) break;
  }
  const fl = pressureFunction(p, left, g);
  const fr = pressureFunction(p, right, g);
  const uStar = 0.5 * (left.u + right.u) + 0.5 * (fr.f - fl.f);
  const gm = (g - 1) / (g + 1);
  const starRho = (s: GasState): number =>
    p > s.p
      ? (s.rho * (p / s.p + gm)) / (gm * (p / s.p) + 1) // Toro eq. 4.50 / 4.57
      : s.rho * Math.pow(p / s.p, 1 / g); // isentropic, Toro eq. 4.53 / 4.60
  return {
    gamma: g,
    left,
    right,
    pStar: p,
    uStar,
    rhoStarL: starRho(left),
    rhoStarR: starRho(right),
    leftShock: p > left.p,
    rightShock: p > right.p,
    iterations,
  };
}

/** Shock speeds (Toro eqs. 4.52, 4.59); NaN for a side with a rarefaction. */
export function shockSpeeds(sol: RiemannSolution): { left: number; right: number } {
  const g = sol.gamma;
  const { left: l, right: r, pStar: p } = sol;
  const k = (g + 1) / (2 * g);
  const c = (g - 1) / (2 * g);
  return {
    left: sol.leftShock ? l.u - sound(l, g) * Math.sqrt(k * (p / l.p) + c) : NaN,
    right: sol.rightShock ? r.u + sound(r, g) * Math.sqrt(k * (p / r.p) + c) : NaN,
  };
}

/**
 * The edges of the star region at unit time: the tail of the left wave and
 * the head of the right wave (for a shock both are the shock speed).
 */
export function starRegionSpeeds(sol: RiemannSolution): { from: number; to: number } {
  const g = sol.gamma;
  const sh = shockSpeeds(sol);
  const aStarL = Math.sqrt((g * sol.pStar) / sol.rhoStarL);
  const aStarR = Math.sqrt((g * sol.pStar) / sol.rhoStarR);
  return {
    from: sol.leftShock ? sh.left : sol.uStar - aStarL,
    to: sol.rightShock ? sh.right : sol.uStar + aStarR,
  };
}

/**
 * The outermost wave speeds at unit time: the head of the left wave (its
 * shock, or u_L − a_L for a fan) and of the right wave. Outside them the gas
 * is still in its initial state.
 */
export function waveFrontSpeeds(sol: RiemannSolution): { left: number; right: number } {
  const sh = shockSpeeds(sol);
  return {
    left: sol.leftShock ? sh.left : sol.left.u - sound(sol.left, sol.gamma),
    right: sol.rightShock ? sh.right : sol.right.u + sound(sol.right, sol.gamma),
  };
}

/** The solution at s = x/t (Toro 2009 §4.5). */
export function sampleRiemann(sol: RiemannSolution, s: number): GasState {
  const g = sol.gamma;
  const { left: l, right: r, pStar: p, uStar: u } = sol;
  const sh = shockSpeeds(sol);
  if (s <= u) {
    // left of the contact
    const aL = sound(l, g);
    if (sol.leftShock) {
      return s <= sh.left ? { ...l } : { rho: sol.rhoStarL, u, p };
    }
    const head = l.u - aL;
    const tail = u - aL * Math.pow(p / l.p, (g - 1) / (2 * g));
    if (s <= head) return { ...l };
    if (s >= tail) return { rho: sol.rhoStarL, u, p };
    // inside the left fan (Toro eq. 4.56)
    const c = 2 / (g + 1) + ((g - 1) / ((g + 1) * aL)) * (l.u - s);
    return {
      rho: l.rho * Math.pow(c, 2 / (g - 1)),
      u: (2 / (g + 1)) * (aL + ((g - 1) / 2) * l.u + s),
      p: l.p * Math.pow(c, (2 * g) / (g - 1)),
    };
  }
  const aR = sound(r, g);
  if (sol.rightShock) {
    return s >= sh.right ? { ...r } : { rho: sol.rhoStarR, u, p };
  }
  const head = r.u + aR;
  const tail = u + aR * Math.pow(p / r.p, (g - 1) / (2 * g));
  if (s >= head) return { ...r };
  if (s <= tail) return { rho: sol.rhoStarR, u, p };
  // inside the right fan (Toro eq. 4.63)
  const c = 2 / (g + 1) - ((g - 1) / ((g + 1) * aR)) * (r.u - s);
  return {
    rho: r.rho * Math.pow(c, 2 / (g - 1)),
    u: (2 / (g + 1)) * (-aR + ((g - 1) / 2) * r.u + s),
    p: r.p * Math.pow(c, (2 * g) / (g - 1)),
  };
}
