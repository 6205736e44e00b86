/**
 * The glossary: each abbreviation and figure the screens and the text
 * commands show, in plain words an apprentice can read. One table for
 * `tractwave help words` and the view's glossary page (`?` then `g`).
 *
 * `shown` lists the exact forms that appear on screen (test/present/
 * glossary.test.ts renders every view at 80×24 and checks that each
 * abbreviation it finds has an entry here).
 */

export interface GlossaryEntry {
  /** the word or figure as a heading */
  term: string;
  /** the forms it takes on screen (abbreviations, symbols) */
  shown: readonly string[];
  /** what it means, in plain words */
  meaning: string;
}

export const GLOSSARY: readonly GlossaryEntry[] = [
  {
    term: 'volumetric efficiency',
    shown: ['ηv', 'VE'],
    meaning:
      'How well the cylinder fills: the fresh air delivered through the intake valve in one cycle, divided by the air that would fill the swept volume at the ambient density (ambient pressure and temperature). 100 % fills it exactly; a tuned runner can push it above 100 %.',
  },
  {
    term: 'θ, crank angle',
    shown: ['θ', '°'],
    meaning: 'Where the crank is, in degrees. 0° is TDC at the start of the intake stroke; one cycle of a four-stroke is 720°.',
  },
  {
    term: 'TDC, BDC',
    shown: ['TDC', 'BDC'],
    meaning: 'Top and bottom dead centre: the piston at the top or the bottom of its stroke.',
  },
  {
    term: 'BTDC, ATDC, BBDC, ABDC',
    shown: ['BTDC', 'ATDC', 'BBDC', 'ABDC'],
    meaning: 'Before / after top dead centre, before / after bottom dead centre: how the cam card gives the valve events.',
  },
  {
    term: 'IVO, IVC, EVO, EVC',
    shown: ['IVO', 'IVC', 'EVO', 'EVC'],
    meaning: 'Intake valve opens, intake valve closes, exhaust valve opens, exhaust valve closes.',
  },
  {
    term: 'overlap',
    shown: ['overlap'],
    meaning: 'The crank angle around TDC when the exhaust valve has not yet closed and the intake valve has already opened.',
  },
  {
    term: 'runner',
    shown: ['runner'],
    meaning: 'The intake pipe between the plenum (or the open air) and the valve. Its length sets when the pressure waves arrive at the valve.',
  },
  {
    term: 'exhaust port',
    shown: ['exh. port', 'exh.', 'exhaust port'],
    meaning: 'The pressure at the valve end of the exhaust pipe (drawn ∘ beside the intake pressure): below the intake side during overlap it pulls fresh gas through, above it pushes burned gas back.',
  },
  {
    term: 'diameter',
    shown: ['dia.', 'D'],
    meaning: 'The inside diameter of a pipe, or the head diameter of a valve.',
  },
  {
    term: 'plenum, airbox',
    shown: ['plenum', 'airbox'],
    meaning: 'The box the runner draws from. It is fed from outside through a throttle body or a snorkel.',
  },
  {
    term: 'round trip',
    shown: ['round trip', '2L/a', '12·N·L/a'],
    meaning:
      'The time a pressure wave takes to run up the runner and back: 2L/a seconds (L the runner length, a the speed of sound), or 12·N·L/a crank degrees at N rpm.',
  },
  {
    term: 'a, speed of sound',
    shown: ['a', 'm/s', 'ft/s'],
    meaning: 'How fast a pressure wave travels in the gas. It grows with the temperature: about 343 m/s (1125 ft/s) in air at 20 °C (68 °F).',
  },
  {
    term: 'quarter-wave frequency',
    shown: ['quarter-wave', 'f₁'],
    meaning:
      'The frequency a pipe closed at one end (the shut valve) rings at: f₁ = a/(4(L+δ)), δ the open-end correction. A hand figure beside the simulation; the speed of sound is taken at the ambient temperature.',
  },
  {
    term: 'wave order',
    shown: ['order', 'wave order'],
    meaning:
      'How many quarter-wave periods fit into one 720° cycle at this speed: f₁·120/N. A whole number means the wave lines up with the cycle; lower orders (2, 3) ram harder than high ones.',
  },
  {
    term: 'ringing phase',
    shown: ['ringing phase', 'phase'],
    meaning:
      'While the valve is shut the runner rings like a bell. The phase says where in one ring the valve event falls: 0° at a compression peak (pressure high, helps), 180° at an expansion trough (pressure low, costs).',
  },
  {
    term: 'compression peak',
    shown: ['peak', 'peak °'],
    meaning: 'The highest pressure of a wave at the valve. A peak just before IVC pushes extra charge in (ram effect).',
  },
  {
    term: 'helping, costing, neutral',
    shown: ['helping', 'costing', 'neutral', 'wave @IVC', 'wave at IVC'],
    meaning: 'What the pressure wave at the valve does when it closes: a compression there rams charge in (helping), an expansion lets charge out (costing).',
  },
  {
    term: 'vs ambient',
    shown: ['vs ambient', 'above', 'below', 'gauge'],
    meaning:
      'A pressure against the outside air, as a gauge reads it: + above, − below (a depression, vacuum). In imperial units such a reading is in inHg, absolute pressures in psi.',
  },
  {
    term: 'kPa, psi, inHg',
    shown: ['kPa', 'psi', 'inHg'],
    meaning: 'Pressure units: kilopascal; pound-force per square inch (6.894757 kPa); inch of mercury at 0 °C (3.386389 kPa). The outside air is about 101.3 kPa, 14.7 psi or 29.9 inHg.',
  },
  {
    term: 'mg, gr',
    shown: ['mg', 'gr'],
    meaning: 'Mass of the charge per cycle: milligram; grain (64.79891 mg).',
  },
  {
    term: 'g/s, lb/min',
    shown: ['g/s', 'lb/min'],
    meaning: 'Mass flow through the valve: gram per second; pound per minute (7.56 g/s).',
  },
  {
    term: 'mm, in, ci, cc, L',
    shown: ['mm', 'in', 'ci', 'cc', 'L'],
    meaning: 'Lengths in millimetres or inches (25.4 mm); volumes in cubic centimetres (cc), cubic inches (ci, 16.387 cc) or litres (L).',
  },
  {
    term: 'N·m, lb·ft, kW, hp',
    shown: ['N·m', 'lb·ft', 'kW', 'hp', '*'],
    meaning: 'Torque and power: newton metre, pound-force foot (1.356 N·m), kilowatt, horsepower (745.7 W). Marked * where they are estimates from ηv, not simulated.',
  },
  {
    term: 'trapped mass',
    shown: ['trapped'],
    meaning: 'The gas in the cylinder when the intake valve closes: fresh charge plus the residual gas left from the last cycle.',
  },
  {
    term: 'residual gas',
    shown: ['residual'],
    meaning: 'Burned gas from the last cycle that stays in the cylinder or is pushed back into the intake during overlap.',
  },
  {
    term: 'reverse flow',
    shown: ['reverse', 'back into the runner'],
    meaning: 'Gas flowing out of the cylinder back into the runner, for example just after IVO or before IVC at low speed.',
  },
  {
    term: 'lift, L/D',
    shown: ['lift', 'L/D'],
    meaning: 'How far the valve is off its seat; L/D is that lift divided by the valve head diameter (about 0.25–0.3 at full lift on most engines).',
  },
  {
    term: 'Cd, discharge coefficient',
    shown: ['Cd'],
    meaning: 'How much of the geometric opening the flow really uses: the measured flow divided by the ideal flow through that area. A flow bench gives it against L/D.',
  },
  {
    term: 'curtain area',
    shown: ['curtain', 'π·D·L'],
    meaning: 'The opening of a valve as a cylinder of the valve diameter D and the lift L: π·D·L per valve.',
  },
  {
    term: 'entry loss',
    shown: ['entry loss', 'K'],
    meaning: 'The pressure lost where the air enters the runner, as a coefficient K of the dynamic pressure: about 0.5 for a plain sharp edge, near 0.05 for a good bellmouth.',
  },
  {
    term: 'Fanning friction factor',
    shown: ['Fanning f', 'f'],
    meaning: 'The wall friction of the runner: wall shear stress over the dynamic pressure ½ρu². Smooth pipes run near 0.004–0.006.',
  },
  {
    term: 'Helmholtz',
    shown: ['Helmholtz'],
    meaning: 'A volume joined to the outside through a neck rings like a bottle you blow across: f = (a/2π)·√(S/(V·L)), S and L the neck area and length, V the volume.',
  },
  {
    term: 'band, band mean',
    shown: ['band', 'band mean', 'mean'],
    meaning: 'The speed range the engine is really driven in, and ηv averaged over it: the area under the curve, not the peak alone.',
  },
  {
    term: 'baseline',
    shown: ['baseline', 'pin', 'pinned', 'before'],
    meaning: 'A result kept to compare with (key p): the traces drawn dim behind the present ones, and the difference in points.',
  },
  {
    term: 'as loaded',
    shown: ['as loaded'],
    meaning: 'The case as its file gives it, before any change made in the Case view.',
  },
  {
    term: 'points',
    shown: ['points', 'pts'],
    meaning: 'A difference of two percentages: 95 % against 92 % is +3 points (not +3.3 %).',
  },
  {
    term: 'mass imbalance',
    shown: ['imbalance', 'imbal', 'mass balance'],
    meaning: 'The solver checking itself: the mass in through the runner entry against the mass through the valve over one cycle. Above 0.5 % the figures are suspect (try a finer mesh).',
  },
  {
    term: 'converged, cycles',
    shown: ['converged', 'conv', 'cycles', 'periodic'],
    meaning: 'The simulation repeats engine cycles until one is the same as the last (the delivered mass changes by less than the tolerance). NOT converged means the figures may still move.',
  },
  {
    term: 'rpm, N',
    shown: ['rpm', 'N'],
    meaning: 'Engine speed in revolutions per minute.',
  },
  {
    term: 'space–time map',
    shown: ['▓', '░', 'blank', 'near'],
    meaning: 'The Runner view: pressure along the pipe (down the screen) against crank angle (across). Dark marks above ambient, light below, blank near ambient; a pulse is seen as a slanted stripe travelling and reflecting.',
  },
  {
    term: 'estimate',
    shown: ['estimate', 'est.'],
    meaning: 'A figure from a hand rule or an assumption, not from the simulation; to be verified on an engine.',
  },
];

/** The entry that lists this on-screen form, if any. */
export function glossaryEntry(shown: string): GlossaryEntry | undefined {
  return GLOSSARY.find((e) => e.shown.includes(shown));
}

/** The glossary as text lines of `width` columns: the term, then its meaning indented. */
export function glossaryLines(width: number): string[] {
  const out: string[] = [];
  for (const e of GLOSSARY) {
    const shown = e.shown.filter((x) => !e.term.includes(x) && x.length <= 12).slice(0, 6);
    out.push(`${e.term}${shown.length ? ` (${shown.join(', ')})` : ''}`);
    let cur = '   ';
    for (const word of e.meaning.split(/\s+/)) {
      if (cur.length + 1 + word.length > width && cur.trim() !== '') {
        out.push(cur);
        cur = `    ${word}`;
      } else cur = cur === '   ' ? `    ${word}` : `${cur} ${word}`;
    }
    if (cur.trim() !== '') out.push(cur);
  }
  return out;
}
