/**
 * A line-for-line TypeScript port of ../shared/bench/ref_moc.c (the C floor):
 * the same homentropic characteristics update with linear interpolation at
 * the feet, friction and area-change sources, closed ends, on Float64Arrays.
 * Run beside the C program it measures what the language and JIT cost alone,
 * so the rest of the gap to the solver is the solver's extra physics
 * (entropy levels, heat transfer, mass correction, boundaries).
 *
 *   node --import tsx bench/ref-moc.ts NODES STEPS   → prints node updates per second
 */
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';

export function refMocRate(n: number, steps: number): { rate: number; checksum: number } {
  const g = 1.4;
  const gm = (g - 1) / 2;
  const dx = 1.0 / (n - 1);
  const fric = 0.02;
  let lam = new Float64Array(n);
  let bet = new Float64Array(n);
  let nl = new Float64Array(n);
  let nb = new Float64Array(n);
  const area = new Float64Array(n);
  const dlna = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = i * dx;
    area[i] = 1.0 - 0.2 * x;
    lam[i] = 1.0 + 0.05 * Math.exp(-200 * (x - 0.3) * (x - 0.3));
    bet[i] = 1.0;
  }
  for (let i = 0; i < n; i++) dlna[i] = (area[i < n - 1 ? i + 1 : i]! - area[i > 0 ? i - 1 : i]!) / (2 * dx * area[i]!);
  const t0 = performance.now();
  for (let s = 0; s < steps; s++) {
    let cmax = 0;
    for (let i = 0; i < n; i++) {
      const a = 0.5 * (lam[i]! + bet[i]!);
      const u = (lam[i]! - bet[i]!) / (2 * gm);
      const c = Math.abs(u) + a;
      if (c > cmax) cmax = c;
    }
    const dz = (0.9 * dx) / cmax;
    for (let i = 1; i < n - 1; i++) {
      const aL = 0.5 * (lam[i - 1]! + bet[i - 1]!);
      const uL = (lam[i - 1]! - bet[i - 1]!) / (2 * gm);
      const a0 = 0.5 * (lam[i]! + bet[i]!);
      const u0 = (lam[i]! - bet[i]!) / (2 * gm);
      const sl = ((u0 + a0) * dz) / dx;
      const lr = lam[i]! - sl * (lam[i]! - lam[i - 1]!);
      const ar = a0 - sl * (a0 - aL);
      const ur = u0 - sl * (u0 - uL);
      const aR = 0.5 * (lam[i + 1]! + bet[i + 1]!);
      const uR = (lam[i + 1]! - bet[i + 1]!) / (2 * gm);
      const sb = ((a0 - u0) * dz) / dx;
      const br = bet[i]! - sb * (bet[i]! - bet[i + 1]!);
      const as = a0 - sb * (a0 - aR);
      const us = u0 - sb * (u0 - uR);
      const srcL = -gm * ar * ur * dlna[i]! * dz - gm * fric * ur * Math.abs(ur) * (1 - ((g - 1) * ur) / ar) * dz;
      const srcB = -gm * as * us * dlna[i]! * dz + gm * fric * us * Math.abs(us) * (1 + ((g - 1) * us) / as) * dz;
      nl[i] = lr + srcL;
      nb[i] = br + srcB;
    }
    {
      let a0 = 0.5 * (lam[0]! + bet[0]!);
      let u0 = (lam[0]! - bet[0]!) / (2 * gm);
      const sb = ((a0 - u0) * dz) / dx;
      nb[0] = bet[0]! - sb * (bet[0]! - bet[1]!);
      nl[0] = nb[0]!;
      const k = n - 1;
      a0 = 0.5 * (lam[k]! + bet[k]!);
      u0 = (lam[k]! - bet[k]!) / (2 * gm);
      const sl = ((u0 + a0) * dz) / dx;
      nl[k] = lam[k]! - sl * (lam[k]! - lam[k - 1]!);
      nb[k] = nl[k]!;
    }
    let t = lam;
    lam = nl;
    nl = t;
    t = bet;
    bet = nb;
    nb = t;
  }
  const secs = (performance.now() - t0) / 1000;
  let checksum = 0;
  for (let i = 0; i < n; i++) checksum += lam[i]! - bet[i]!;
  return { rate: (n * steps) / secs, checksum };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const n = Number(process.argv[2] ?? 60);
  const steps = Number(process.argv[3] ?? 200000);
  refMocRate(n, Math.min(20000, steps)); // warm the JIT
  const { rate, checksum } = refMocRate(n, steps);
  process.stderr.write(`checksum ${checksum.toFixed(6)}\n`);
  process.stdout.write(`${rate.toFixed(0)}\n`);
}
