/**
 * The teaching line: what the valve and the wave are doing at the cursor's
 * crank angle, in plain words for an apprentice. It reads the samples the
 * core computed at that degree (lift, flow, the valve-end pressure against
 * the reference pressure); it computes no physics of its own.
 */
import { mod } from './chart.js';
import { METRIC, type Units } from '../present/units.js';

export interface Moment {
  /** crank angle [deg, 0..719] */
  crank: number;
  /** intake lift [m] */
  lift: number;
  /** exhaust lift [m] */
  exhaustLift: number;
  /** static pressure at the valve end of the runner [Pa] */
  valvePressure: number;
  /** intake-valve mass flow [kg/s], positive into the cylinder */
  valveFlow: number;
  /** the pressure the runner draws from [Pa] (ambient or plenum) */
  reference: number;
  events: { ivo: number; ivc: number; evo: number; evc: number };
}

/** |Δp| below this fraction of the reference reads as "near ambient" (presentation threshold). */
export const NEAR_FRACTION = 0.01;

export function strokeOf(crank: number): string {
  const t = mod(crank, 720);
  if (t < 180) return 'Intake stroke (piston down)';
  if (t < 360) return 'Compression stroke (piston up)';
  if (t < 540) return 'Power stroke (piston down)';
  return 'Exhaust stroke (piston up)';
}

/** Degrees from `a` forward to `b` around the cycle. */
function ahead(a: number, b: number): number {
  return mod(b - a, 720);
}

function waveAtValve(m: Moment): 'compression' | 'expansion' | 'near' {
  const dp = m.valvePressure - m.reference;
  if (Math.abs(dp) < NEAR_FRACTION * m.reference) return 'near';
  return dp > 0 ? 'compression' : 'expansion';
}

/** One or two sentences (about 150 characters at most) on the valve and the wave at this degree. */
export function teachingLine(m: Moment, u: Units = METRIC): string {
  const dp = `${u.signed('gauge', m.valvePressure - m.reference)} ${u.label('gauge')}`;
  const wave = waveAtValve(m);
  const intakeOpen = m.lift > 0;
  const exhaustOpen = m.exhaustLift > 0;
  const toIvc = ahead(m.crank, m.events.ivc);
  const fromIvo = ahead(m.events.ivo, m.crank);
  let now: string;
  if (intakeOpen && exhaustOpen) {
    now =
      'Overlap: both valves open; the runner wave and the exhaust both act on the cylinder' +
      (m.valveFlow < 0 ? '; gas flows back up the runner' : '');
  } else if (intakeOpen && fromIvo <= 15) {
    now =
      'The intake valve is opening: the ringing that arrives now decides how the flow starts' +
      (wave === 'near' ? ' (near ambient)' : ` (${wave}, ${dp})`);
  } else if (intakeOpen && toIvc <= 25) {
    const what =
      wave === 'compression'
        ? `a compression wave is at the valve (${dp}) and rams extra charge in`
        : wave === 'expansion'
          ? `the valve sees an expansion (${dp}), so charge is lost as it shuts`
          : 'the pressure at the valve is near ambient: the wave neither helps nor costs much';
    now = `The intake valve closes in ${toIvc}°: ${what}`;
  } else if (intakeOpen) {
    if (m.valveFlow < 0) now = `Gas flows back out past the open valve into the runner (${dp} at the valve)`;
    else if (wave === 'expansion')
      now = `Suction drops the valve-end pressure (${dp}); the expansion runs to the open end and comes back as a compression`;
    else if (wave === 'compression') now = `A compression wave has come back to the valve (${dp}) and pushes air in`;
    else now = 'Air flows in past the open valve; the pressure at the valve is near ambient';
  } else if (ahead(m.events.ivc, m.crank) <= 10) {
    const what =
      wave === 'compression'
        ? `with a compression at the valve (${dp}): the wave packed extra charge in`
        : wave === 'expansion'
          ? `on an expansion (${dp}): the wave cost charge`
          : 'near ambient pressure: the wave did little either way';
    now = `The intake valve has just closed ${what}`;
  } else if (ahead(m.crank, m.events.ivo) <= 10) {
    now = `The intake valve is about to open; the valve end is ${wave === 'near' ? 'near ambient' : `${wave === 'compression' ? 'above' : 'below'} ambient (${dp})`}`;
  } else {
    const at =
      wave === 'compression'
        ? `now a compression (${dp}) is at the valve`
        : wave === 'expansion'
          ? `now an expansion (${dp}) is at the valve`
          : 'now the valve end is near ambient';
    now = `Intake valve shut: the wave rings between the valve and the open end; ${at}`;
  }
  return `${strokeOf(m.crank)}. ${now}.`;
}
