/**
 * An independent solution of the capacitor-input circuit (docs/references.md §3):
 *   C dv/dt = max(0, V_pk |sin ωt| − V_drop − v) / R_s − I_load(v)
 * integrated with the classical fixed-step fourth-order Runge–Kutta method (docs/references.md §3,
 * Numerical Recipes §16.1, from memory) from the no-load voltage, half-cycle after half-cycle, until
 * the voltage at the start of a half-cycle stops changing; then one more half-cycle is sampled.
 * The reckoner uses a different method (an exact exponential per step and a root search for the
 * periodic state); nothing here is imported from it.
 */
export interface Circuit {
  vPeak: number;
  drop: number;
  rs: number;
  c: number;
  f: number;
  /** A constant-current load (A) or a resistive one (Ω). */
  load: { current: number } | { resistance: number };
  stepsPerHalfCycle?: number;
  /** Settled when a half-cycle changes the start voltage by less than this × V_pk (default 1e-10). */
  settleTolerance?: number;
}

export function solveByRk4(p: Circuit) {
  const n = p.stepsPerHalfCycle ?? 20000;
  const w = 2 * Math.PI * p.f;
  const h = 1 / (2 * p.f) / n;
  const diode = (t: number, v: number) =>
    Math.max(0, (p.vPeak * Math.abs(Math.sin(w * t)) - p.drop - v) / p.rs);
  const loadI = (v: number) => ('current' in p.load ? p.load.current : v / p.load.resistance);
  const slope = (t: number, v: number) => (diode(t, v) - loadI(v)) / p.c;
  const rk4 = (t: number, v: number) => {
    const k1 = slope(t, v);
    const k2 = slope(t + h / 2, v + (h / 2) * k1);
    const k3 = slope(t + h / 2, v + (h / 2) * k2);
    const k4 = slope(t + h, v + h * k3);
    return v + (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
  };
  let v = p.vPeak - p.drop;
  let step = 0;
  let settled = false;
  for (let half = 0; half < 3000 && !settled; half++) {
    const start = v;
    for (let j = 0; j < n; j++, step++) v = rk4(step * h, v);
    settled = half > 4 && Math.abs(v - start) < (p.settleTolerance ?? 1e-10) * p.vPeak;
  }
  // Sample one ripple period (half a mains cycle); uniform samples over a whole period give the means.
  const vs: number[] = [];
  const ids: number[] = [];
  for (let j = 0; j < n; j++, step++) {
    vs.push(v);
    ids.push(diode(step * h, v));
    v = rk4(step * h, v);
  }
  const mean = (xs: number[]) => xs.reduce((a, x) => a + x, 0) / xs.length;
  const averageDc = mean(vs);
  const load = mean(vs.map(loadI));
  return {
    settled,
    averageDc,
    minimum: Math.min(...vs),
    maximum: Math.max(...vs),
    ripplePeakToPeak: Math.max(...vs) - Math.min(...vs),
    rippleRms: Math.sqrt(mean(vs.map((x) => (x - averageDc) ** 2))),
    peakDiodeCurrent: Math.max(...ids),
    diodeMean: mean(ids),
    /** rms of the rectifier current over a half-cycle: the winding current of a bridge. */
    halfCycleRms: Math.sqrt(mean(ids.map((i) => i * i))),
    capacitorRms: Math.sqrt(mean(ids.map((i, k) => (i - loadI(vs[k]!)) ** 2))),
    conduction: ids.filter((i) => i > 0).length / n,
    load,
  };
}
