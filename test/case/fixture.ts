/** A plain valid case (raw, as from YAML) for tests: the Heywood example engine geometry. */
export function baseCase(): Record<string, any> {
  return {
    name: 'test single',
    // B = S = 86 mm, l = 143.5 mm, rc = 10: the worked example of REFERENCES.md (Heywood 1988, eqs. 2.4–2.6)
    engine: { bore: '86 mm', stroke: '86 mm', rod: '143.5 mm', compressionRatio: 10 },
    ambient: { pressure: '101.325 kPa', temperature: '20 degC' },
    intake: { valves: 2, diameter: '33 mm', maxLift: '9 mm', opens: 30, closes: 60 },
    exhaust: { valves: 2, diameter: '28 mm', maxLift: '8 mm', opens: 60, closes: 30, backPressure: '105 kPa', gasTemperature: '950 K' },
    runner: { length: '300 mm', diameter: '40 mm' },
    rpm: 6500,
  };
}
