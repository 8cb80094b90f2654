/**
 * Brings a periodic time-domain simulation to its steady state by shooting on one state variable
 * (a DC capacitor's voltage): g(v) = v(after one cycle) − v(start) → 0 by secant steps, each at
 * most ±0.2 pu and taken only where g falls with v, at most 12 of them or until |g| < 1e-7; then
 * one more cycle. The next cycle `runCycle` runs is the steady one to record. O(14 cycles).
 *
 * @param runCycle simulates one supply cycle from the current state (without recording)
 * @param state reads and sets the shooting variable held by the simulation
 * @example shootSteadyState(() => runCycle(null), { get: () => vc, set: (v) => (vc = v) }); runCycle(record);
 */
export function shootSteadyState(runCycle: () => void, state: { get(): number; set(value: number): void }): void {
  runCycle();
  let v0 = state.get();
  runCycle();
  let g0 = state.get() - v0;
  let v1 = state.get();
  for (let it = 0; it < 12; it++) {
    runCycle();
    const g1 = state.get() - v1;
    if (Math.abs(g1) < 1e-7) break;
    const slope = (g1 - g0) / (v1 - v0);
    v0 = v1;
    g0 = g1;
    if (Number.isFinite(slope) && slope < -1e-6) state.set(v1 + Math.max(-0.2, Math.min(0.2, -g1 / slope)));
    v1 = state.get();
  }
  runCycle();
}
