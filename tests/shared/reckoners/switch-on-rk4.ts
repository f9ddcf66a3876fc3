/**
 * The first cycles after switch-on, integrated in time (classical RK4, docs/references.md §3, §7): the
 * mains switched on at its positive peak, an ideal full-wave rectifier with a constant drop, the
 * source resistance and an empty reservoir with no load. Returns the peak current and ∫ i² dt.
 */
export function simulateSwitchOn(o: { vPeak: number; drop: number; rs: number; c: number; hz: number }) {
  const w = 2 * Math.PI * o.hz;
  const h = 1 / o.hz / 20_000;
  const current = (t: number, v: number) =>
    Math.max(0, (Math.abs(o.vPeak * Math.cos(w * t)) - o.drop - v) / o.rs);
  let v = 0;
  let peak = 0;
  let i2t = 0;
  for (let t = 0; t < 10 / o.hz; t += h) {
    const k1 = current(t, v) / o.c;
    const k2 = current(t + h / 2, v + (h / 2) * k1) / o.c;
    const k3 = current(t + h / 2, v + (h / 2) * k2) / o.c;
    const k4 = current(t + h, v + h * k3) / o.c;
    const i0 = current(t, v);
    v += (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    const i1 = current(t + h, v);
    peak = Math.max(peak, i0);
    i2t += (h / 2) * (i0 * i0 + i1 * i1);
  }
  return { peak, i2t };
}
