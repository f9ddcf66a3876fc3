/**
 * Time-step model of a full-wave rectifier charging a reservoir capacitor through a source
 * resistance, with a constant-current load, solved to periodic steady state.
 *
 * Over each step the source is linear in time, so while the rectifier conducts the capacitor
 * follows an exact exponential (no step-size instability, even when R·C ≪ step). Steady state
 * is the fixed point of the half-cycle map v0 → v(T/2), found by a bracketed secant search
 * rather than by simulating hundreds of cycles of settling.
 */

export interface CapInputParams {
  /** Peak of the winding's open-circuit voltage, V. */
  vPeak: number;
  /** Constant forward drop in the conducting path, V. */
  drop: number;
  /** Source resistance (winding + rectifier), Ω; > 0. */
  rSource: number;
  /** Reservoir capacitance, F; > 0. */
  capacitance: number;
  /** Mains frequency, Hz; ripple is at twice this. */
  frequency: number;
  /** DC load current, A; ≥ 0. */
  loadCurrent: number;
  stepsPerHalfCycle?: number;
}

export interface CapInputResult {
  averageDc: number;
  minimum: number;
  maximum: number;
  ripplePeakToPeak: number;
  rippleRms: number;
  /** Peak repetitive current in the rectifier, A. */
  peakRectifierCurrent: number;
  /** rms of the rectifier current over one half-cycle (the winding current of a bridge), A. */
  rectifierRmsHalfCycle: number;
  /** rms ripple current in the reservoir capacitor, A. */
  capacitorRmsCurrent: number;
  /** Fraction of each half-cycle in which the rectifier conducts, 0–1. */
  conductionFraction: number;
}

export class CapInputOverload extends Error {}

interface Prepared {
  n: number;
  e: Float64Array; // source minus drop at each step point
  decay: number; // exp(-h/τ)
  h: number;
  tau: number;
  dropPerStep: number; // I·h/C, the discharge per step when not conducting
  p: CapInputParams;
}

function prepare(p: CapInputParams): Prepared {
  const n = p.stepsPerHalfCycle ?? 4000;
  const h = 1 / (2 * p.frequency * n);
  const e = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) e[k] = p.vPeak * Math.sin((Math.PI * k) / n) - p.drop;
  e[n] = -p.drop; // exact zero crossing
  const tau = p.rSource * p.capacitance;
  return { n, e, decay: Math.exp(-h / tau), h, tau, dropPerStep: (p.loadCurrent * h) / p.capacitance, p };
}

/** One step from v0 between step points k and k+1. */
function step(pr: Prepared, k: number, v0: number): number {
  const ir = pr.p.loadCurrent * pr.p.rSource;
  const u0 = pr.e[k]! - ir;
  const u1 = pr.e[k + 1]! - ir;
  const st = ((u1 - u0) / pr.h) * pr.tau; // slope × τ
  const conducting = u1 - st + (v0 - u0 + st) * pr.decay;
  const blocked = v0 - pr.dropPerStep;
  // Both are lower bounds of the true value (each assumes the wrong state for part of the step),
  // and each is exact when the rectifier's state does not change within the step.
  return conducting > blocked ? conducting : blocked;
}

function halfCycle(pr: Prepared, v0: number): number {
  let v = v0;
  for (let k = 0; k < pr.n; k++) v = step(pr, k, v);
  return v;
}

/** Steady-state reservoir voltage at the start of a half-cycle (source zero crossing). */
function steadyStart(pr: Prepared): number {
  const hi = pr.p.vPeak - pr.p.drop;
  const g = (v: number) => halfCycle(pr, v) - v;
  const gHi = g(hi);
  if (gHi >= -1e-12 * hi) return hi; // no load: the reservoir stays at the peak
  const lo = 0;
  const gLo = g(lo);
  if (gLo <= 0) throw new CapInputOverload('the source cannot supply this load current');
  let a = lo;
  let b = hi;
  let ga = gLo;
  let gb = gHi;
  let side = 0;
  const tol = 1e-10 * hi;
  for (let i = 0; i < 200; i++) {
    // Illinois regula falsi: g is monotone decreasing in v, so the bracket always holds.
    const c = (a * gb - b * ga) / (gb - ga);
    const gc = g(c);
    if (Math.abs(gc) < tol || b - a < tol) return c;
    if (gc > 0) {
      a = c;
      ga = gc;
      if (side === -1) gb /= 2;
      side = -1;
    } else {
      b = c;
      gb = gc;
      if (side === 1) ga /= 2;
      side = 1;
    }
  }
  return (a + b) / 2;
}

export function simulateCapacitorInput(p: CapInputParams): CapInputResult {
  return solve(p).result;
}

/** The steady-state reservoir voltage over one ripple period (a half-cycle of the mains), with the figures it gives. */
export interface CapInputWaveform {
  result: CapInputResult;
  /** The ripple period, s. */
  period: number;
  /** Time from the source's zero crossing at each sample, s (evenly spaced, first 0, last the period). */
  times: Float64Array;
  /** Reservoir voltage at each sample, V. */
  volts: Float64Array;
}

/** The same solution as simulateCapacitorInput, with the samples it averaged, for drawing. */
export function reservoirWaveform(p: CapInputParams): CapInputWaveform {
  const { result, vs, pr } = solve(p);
  return { result, period: pr.n * pr.h, times: Float64Array.from(vs, (_, k) => k * pr.h), volts: vs };
}

function solve(p: CapInputParams) {
  const pr = prepare(p);
  const v0 = steadyStart(pr);
  const { n, e } = pr;
  const R = p.rSource;
  const I = p.loadCurrent;
  const vs = new Float64Array(n + 1);
  const id = new Float64Array(n + 1);
  let v = v0;
  vs[0] = v;
  id[0] = Math.max(0, (e[0]! - v) / R);
  for (let k = 0; k < n; k++) {
    v = step(pr, k, v);
    vs[k + 1] = v;
    id[k + 1] = Math.max(0, (e[k + 1]! - v) / R);
  }
  // Trapezoid means over the half-cycle (the ripple period).
  const mean = (f: (k: number) => number) => {
    let sum = (f(0) + f(n)) / 2;
    for (let k = 1; k < n; k++) sum += f(k);
    return sum / n;
  };
  const avg = mean((k) => vs[k]!);
  let min = Infinity;
  let max = -Infinity;
  let peakI = 0;
  let conducting = 0;
  for (let k = 0; k <= n; k++) {
    if (vs[k]! < min) min = vs[k]!;
    if (vs[k]! > max) max = vs[k]!;
    if (id[k]! > peakI) peakI = id[k]!;
    if (k < n && (id[k]! > 0 || id[k + 1]! > 0)) conducting++;
  }
  if (min <= 0) throw new CapInputOverload('the reservoir voltage falls to zero in each half-cycle');
  const rippleVar = mean((k) => (vs[k]! - avg) ** 2);
  const idSq = mean((k) => id[k]! ** 2);
  const capSq = mean((k) => (id[k]! - I) ** 2);
  const result: CapInputResult = {
    averageDc: avg,
    minimum: min,
    maximum: max,
    ripplePeakToPeak: max - min,
    rippleRms: Math.sqrt(rippleVar),
    peakRectifierCurrent: peakI,
    rectifierRmsHalfCycle: Math.sqrt(idSq),
    capacitorRmsCurrent: Math.sqrt(capSq),
    conductionFraction: conducting / n,
  };
  return { result, vs, pr };
}

/** Light-ripple approximation, full-wave: ΔV_pp ≈ I / (2 f C) [derived]. */
export function rippleApproxFullWave(loadCurrent: number, frequency: number, capacitance: number): number {
  return loadCurrent / (2 * frequency * capacitance);
}
