/**
 * Ideal-gas air. R = 287.05 J/(kg·K) (ISO 2533: 287.05287), γ = 1.4, constant
 * (residual gas is given the same properties).
 *
 * Entropy level: A = a · (P_REF / p)^((γ−1)/(2γ)) [m/s] — the sound speed the
 * gas would have if brought isentropically to P_REF. It is constant along a
 * path line in adiabatic, frictionless flow.
 */
export const GAMMA = 1.4;
export const R_AIR = 287.05;
export const CP = (GAMMA * R_AIR) / (GAMMA - 1);
export const CV = R_AIR / (GAMMA - 1);
/** reference pressure for entropy levels [Pa] */
export const P_REF = 1e5;
/** (γ−1)/2 */
export const G1 = (GAMMA - 1) / 2;
/** exponent of the pressure function: p/P_REF = (a/A)^(2γ/(γ−1)) */
export const PEXP = (2 * GAMMA) / (GAMMA - 1);

export function soundSpeed(temperatureK: number): number {
  return Math.sqrt(GAMMA * R_AIR * temperatureK);
}

export function density(pressurePa: number, temperatureK: number): number {
  return pressurePa / (R_AIR * temperatureK);
}

/** entropy level A [m/s] of gas at (p, T) */
export function entropyLevel(pressurePa: number, temperatureK: number): number {
  return soundSpeed(temperatureK) * Math.pow(P_REF / pressurePa, 1 / PEXP);
}

/** pressure [Pa] of gas with sound speed a and entropy level A */
export function pressureFromSound(a: number, A: number): number {
  return P_REF * Math.pow(a / A, PEXP);
}

/** sound speed [m/s] of gas at pressure p with entropy level A */
export function soundFromPressure(pressurePa: number, A: number): number {
  return A * Math.pow(pressurePa / P_REF, 1 / PEXP);
}

/**
 * x^PEXP, the pressure ratio from a sound-speed ratio. With γ = 1.4 the
 * exponent is exactly 7, so this is four multiplications instead of a
 * general power (it sits in every boundary residual and node update).
 * A γ other than 1.4 must replace it with Math.pow(x, PEXP).
 */
export function powP(x: number): number {
  const x2 = x * x;
  return x2 * x2 * x2 * x;
}
if (Math.abs(PEXP - 7) > 1e-9) throw new Error('gas.ts: powP assumes γ = 1.4 (PEXP = 7)');
