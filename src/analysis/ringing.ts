/**
 * The frequency of a ringing signal from its zero crossings: the mean spacing
 * of the upward crossings of (y − mean), each placed by linear interpolation
 * between samples, after skipping the first `skip` crossings (the start-up).
 * NaN when fewer than two crossings remain.
 */
export function zeroCrossingFrequency(t: readonly number[], y: readonly number[], skip = 1): number {
  if (y.length < 3) return Number.NaN;
  const mean = y.reduce((s, v) => s + v, 0) / y.length;
  const ups: number[] = [];
  for (let i = 1; i < y.length; i++) {
    const a = y[i - 1]! - mean;
    const b = y[i]! - mean;
    if (a < 0 && b >= 0) ups.push(t[i - 1]! + ((t[i]! - t[i - 1]!) * -a) / (b - a));
  }
  const use = ups.slice(skip);
  if (use.length < 2) return Number.NaN;
  return (use.length - 1) / (use[use.length - 1]! - use[0]!);
}
