/**
 * Independent time-domain solutions of the filter sections after the rectifier (docs/references.md
 * §3), integrated with the classical fixed-step fourth-order Runge–Kutta method (§7; Numerical
 * Recipes §16.1, from memory). The reckoners use closed forms (the rectified average, the 2f Fourier
 * term, the stage's attenuation); nothing here is imported from them.
 */

/** Classical RK4 for a two-state system y' = f(t, y); returns the state after one step h. */
function rk4Step(
  f: (t: number, a: number, b: number) => readonly [number, number],
  t: number,
  a: number,
  b: number,
  h: number,
): [number, number] {
  const [a1, b1] = f(t, a, b);
  const [a2, b2] = f(t + h / 2, a + (h / 2) * a1, b + (h / 2) * b1);
  const [a3, b3] = f(t + h / 2, a + (h / 2) * a2, b + (h / 2) * b2);
  const [a4, b4] = f(t + h, a + h * a3, b + h * b3);
  return [a + (h / 6) * (a1 + 2 * a2 + 2 * a3 + a4), b + (h / 6) * (b1 + 2 * b2 + 2 * b3 + b4)];
}

export interface ChokeInputCircuit {
  /** rms of the winding feeding the full-wave rectifier, V. */
  vRms: number;
  /** Forward drop of the rectifier path while it conducts, V. */
  drop?: number;
  /** Mains frequency, Hz. */
  f: number;
  /** Input choke, H. */
  L: number;
  /** Choke plus winding resistance, Ω. */
  rSeries: number;
  /** Capacitor after the choke, F. */
  C: number;
  /** Resistive load across the capacitor, Ω. */
  rLoad: number;
  stepsPerCycle?: number;
  /** Start from rest (empty capacitor, no current) switched on at the mains peak, for the surge. */
  fromRest?: boolean;
  /** Cycles to run instead of the settling rule (the last four are sampled). */
  cycles?: number;
}

/**
 * A full-wave rectifier (ideal but for a constant drop) feeding L (with series R) into C ∥ R_load.
 * The rectifier cannot pass negative current, so the inductor current is clamped at zero — the choke
 * then stops conducting for part of each cycle. Starts near the steady state and settles for
 * 12 R_load C plus 40 cycles; the last four cycles are sampled.
 */
export function simulateChokeInput(o: ChokeInputCircuit) {
  const vPk = Math.SQRT2 * o.vRms;
  const drop = o.drop ?? 0;
  const w = 2 * Math.PI * o.f;
  const n = o.stepsPerCycle ?? 4000;
  const h = 1 / o.f / n;
  let v = o.fromRest ? 0 : 0.9 * o.vRms;
  let i = v / o.rLoad;
  const phase = o.fromRest ? Math.PI / 2 : 0;
  const deriv = (t: number, iL: number, vC: number) => {
    const e = Math.abs(vPk * Math.sin(w * t + phase)) - drop;
    let di = (e - vC - o.rSeries * iL) / o.L;
    if (iL <= 0 && di < 0) di = 0;
    return [di, (iL - vC / o.rLoad) / o.C] as const;
  };
  const cycles = o.cycles ?? Math.ceil(12 * o.rLoad * o.C * o.f + 40) + 4;
  let minI = Infinity;
  let peakI = 0;
  let sumIc2 = 0;
  let sumV = 0;
  let sumV2 = 0;
  let samples = 0;
  for (let k = 0, t = 0; k < cycles * n; k++, t += h) {
    [i, v] = rk4Step(deriv, t, i, v, h);
    i = Math.max(0, i);
    peakI = Math.max(peakI, i);
    if (k >= (cycles - 4) * n) {
      minI = Math.min(minI, i);
      sumIc2 += (i - v / o.rLoad) ** 2;
      sumV += v;
      sumV2 += v * v;
      samples++;
    }
  }
  const mean = sumV / samples;
  return {
    minCurrent: minI,
    /** The largest choke current since the start (from rest: the switch-on surge). */
    peakCurrent: peakI,
    dc: mean,
    rippleRms: Math.sqrt(Math.max(0, sumV2 / samples - mean * mean)),
    /** rms current in the capacitor: choke current less load current. */
    capacitorRms: Math.sqrt(sumIc2 / samples),
  };
}

export interface SectionCircuit {
  /** DC at the section's input, V. */
  vIn: number;
  /** Peak-to-peak of the sinusoidal ripple on the input, V. */
  ripplePeakToPeak: number;
  /** Ripple frequency, Hz. */
  fRipple: number;
  /** Series inductance, H (0 for a resistor section). */
  L: number;
  /** Series resistance: the resistor, or the choke's DC resistance, Ω. */
  R: number;
  /** Capacitor at the node, F. */
  C: number;
  /** Constant current drawn from the node (this node's and every later node's), A. */
  load: number;
}

/**
 * One dropper section driven by DC plus a sinusoidal ripple, loaded by a constant current:
 *   L di/dt = v_in(t) − R i − v_C,  C dv_C/dt = i − I_load   (RC section: i = (v_in − v_C)/R).
 * Starts at the DC operating point and runs until the start-up transient (the LC ring at
 * e^(−Rt/2L), or the RC charge at e^(−t/RC)) has decayed by e^(−25); then over whole ripple periods
 * returns the DC and the ripple's amplitude at the ripple frequency, by Fourier projection.
 */
export function simulateSection(o: SectionCircuit) {
  const w = 2 * Math.PI * o.fRipple;
  const a = o.ripplePeakToPeak / 2;
  const vIn = (t: number) => o.vIn + a * Math.sin(w * t);
  const perPeriod = 400;
  const h = 1 / o.fRipple / perPeriod;
  const decay = o.L > 0 ? (2 * o.L) / o.R : o.R * o.C;
  const settlePeriods = Math.ceil(25 * decay * o.fRipple);
  const measurePeriods = 20;
  const lc = (t: number, i: number, vC: number) =>
    [(vIn(t) - o.R * i - vC) / o.L, (i - o.load) / o.C] as const;
  const rc = (t: number, _i: number, vC: number) => [0, ((vIn(t) - vC) / o.R - o.load) / o.C] as const;
  const deriv = o.L > 0 ? lc : rc;
  let i = o.load;
  let v = o.vIn - o.R * o.load;
  let t = 0;
  for (let k = 0; k < settlePeriods * perPeriod; k++, t += h) [i, v] = rk4Step(deriv, t, i, v, h);
  let sum = 0;
  let sinPart = 0;
  let cosPart = 0;
  const m = measurePeriods * perPeriod;
  for (let k = 0; k < m; k++, t += h) {
    sum += v;
    sinPart += v * Math.sin(w * t);
    cosPart += v * Math.cos(w * t);
    [i, v] = rk4Step(deriv, t, i, v, h);
  }
  const amplitude = (2 / m) * Math.hypot(sinPart, cosPart);
  return { dc: sum / m, ripplePeakToPeak: 2 * amplitude, settlePeriods };
}
