/**
 * Slider-crank kinematics (Heywood 1988, eqs. 2.4–2.6).
 *
 *   V(θ) = Vc + (πB²/4)·(l + a − s),  s = a·cosθ + √(l² − a²·sin²θ)
 *
 * B bore [m], a = stroke/2 crank radius [m], l rod length [m],
 * Vd = (πB²/4)·stroke swept volume [m³], Vc = Vd/(rc − 1) clearance [m³],
 * θ crank angle from TDC [deg] (any TDC: the relation is 360° periodic).
 */
export interface EngineGeometry {
  bore: number;
  stroke: number;
  rod: number;
  compressionRatio: number;
}

const DEG = Math.PI / 180;

export function sweptVolume(g: EngineGeometry): number {
  return (Math.PI / 4) * g.bore * g.bore * g.stroke;
}

export function clearanceVolume(g: EngineGeometry): number {
  return sweptVolume(g) / (g.compressionRatio - 1);
}

/** cylinder volume [m³] at crank angle θ [deg] */
export function cylinderVolume(thetaDeg: number, g: EngineGeometry): number {
  const a = g.stroke / 2;
  const th = thetaDeg * DEG;
  const sn = Math.sin(th);
  const s = a * Math.cos(th) + Math.sqrt(g.rod * g.rod - a * a * sn * sn);
  return clearanceVolume(g) + (Math.PI / 4) * g.bore * g.bore * (g.rod + a - s);
}

/** dV/dθ [m³/deg] */
export function cylinderVolumeRate(thetaDeg: number, g: EngineGeometry): number {
  const a = g.stroke / 2;
  const th = thetaDeg * DEG;
  const sn = Math.sin(th);
  const cs = Math.cos(th);
  const root = Math.sqrt(g.rod * g.rod - a * a * sn * sn);
  const dsdth = -a * sn - (a * a * sn * cs) / root;
  return -(Math.PI / 4) * g.bore * g.bore * dsdth * DEG;
}

/** inner surface of the cylinder at θ (head + piston crown as flat discs + liner) [m²] */
export function cylinderSurface(thetaDeg: number, g: EngineGeometry): number {
  const disc = (Math.PI / 4) * g.bore * g.bore;
  const height = cylinderVolume(thetaDeg, g) / disc;
  return 2 * disc + Math.PI * g.bore * height;
}
