/**
 * Acoustic end corrections: a 1-D pipe that opens into a large space rings as
 * if it were longer by δ, the mass of air just outside the opening moving
 * with the column. The stepper adds δ as a straight virtual extension of the
 * pipe at that end (pipe.ts), so the open end rings like a real one.
 *
 *   unflanged pipe end (a pipe standing free in the air, a runner or snorkel
 *   end standing into a box):               δ = 0.6133·r   (Levine & Schwinger, Phys. Rev. 73, 1948)
 *   flanged end (an opening flush with a wall: a side branch in a duct wall,
 *   a resonator neck in its cavity's wall): δ = 0.8216·r   (Norris & Sheng, J. Sound Vib. 135, 1989;
 *                                                          value from memory)
 * r the opening's radius. A closed end, a valve end and the through-pipes of
 * a junction get none.
 */
export const END_CORRECTION = { unflanged: 0.6133, flanged: 0.8216 } as const;

/** end correction [m] of an opening of diameter d [m] */
export function endCorrection(kind: keyof typeof END_CORRECTION, diameter: number): number {
  return END_CORRECTION[kind] * (diameter / 2);
}
