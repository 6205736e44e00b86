/**
 * The U.S. Standard Atmosphere 1976 (NOAA/NASA/USAF, 1976), its first three
 * layers (up to 32 km geopotential), for the ambient state at an altitude.
 *
 * Symbols: z geometric altitude above mean sea level [m]; H geopotential
 * altitude [m]; T temperature [K]; p pressure [Pa].
 *
 *   H = r0·z/(r0 + z),                    r0 = 6 356 766 m
 *   in a layer with base Hb, Tb, pb and lapse rate Lb [K/m]:
 *     T = Tb + Lb·(H − Hb)
 *     p = pb·(Tb/T)^(g0·M0/(R*·Lb))        (Lb ≠ 0)
 *     p = pb·exp(−g0·M0·(H − Hb)/(R*·Tb))  (Lb = 0)
 *   g0 = 9.80665 m/s², M0 = 0.0289644 kg/mol, R* = 8.31432 J/(mol·K)
 *
 *   layer  Hb [m]   Tb [K]   Lb [K/m]   pb [Pa]
 *   0          0   288.15   −0.0065    101325
 *   1      11000   216.65    0         (from layer 0: 22632.06)
 *   2      20000   216.65   +0.001     (from layer 1: 5474.89)
 *
 * The base pressures of layers 1 and 2 are computed from the layer below, so
 * the profile is continuous. Check values: sea level 101325 Pa, 288.15 K;
 * 1500 m gives 84.56 kPa and 278.40 K (the 1976 tables).
 */

const G0 = 9.80665;
const M0 = 0.0289644;
const R_STAR = 8.31432;
const R0 = 6356766;
const GMR = (G0 * M0) / R_STAR;

/** lowest and highest geometric altitude this model is given for [m] */
export const ALTITUDE_LIMITS = { min: -1000, max: 32000 } as const;

interface Layer {
  hb: number;
  tb: number;
  lb: number;
  pb: number;
}

function layerPressure(l: Layer, h: number): number {
  const t = l.tb + l.lb * (h - l.hb);
  return l.lb === 0 ? l.pb * Math.exp((-GMR * (h - l.hb)) / l.tb) : l.pb * Math.pow(l.tb / t, GMR / l.lb);
}

const LAYERS: Layer[] = (() => {
  const out: Layer[] = [{ hb: 0, tb: 288.15, lb: -0.0065, pb: 101325 }];
  for (const [hb, lb] of [
    [11000, 0],
    [20000, 0.001],
  ] as const) {
    const below = out[out.length - 1]!;
    out.push({ hb, tb: below.tb + below.lb * (hb - below.hb), lb, pb: layerPressure(below, hb) });
  }
  return out;
})();

/** geopotential altitude H [m] of a geometric altitude z [m] */
export function geopotentialAltitude(z: number): number {
  return (R0 * z) / (R0 + z);
}

/** Pressure [Pa] and temperature [K] of the standard atmosphere at geometric altitude z [m]. */
export function standardAtmosphere(z: number): { pressure: number; temperature: number } {
  const h = geopotentialAltitude(z);
  let layer = LAYERS[0]!;
  for (const l of LAYERS) if (h >= l.hb) layer = l;
  return { pressure: layerPressure(layer, h), temperature: layer.tb + layer.lb * (h - layer.hb) };
}
