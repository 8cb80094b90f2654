// The least-squares line against a hand-worked example and an exactly linear long record.
import { expect, test } from "vitest";
import { LineFit } from "@/lib/analysis/line-fit";

test("four points worked by hand: slope 2.2, intercept 0.7 (ordinary least squares normal equations, from memory)", () => {
  // Points (0, 1), (1, 3), (2, 4), (3, 8): x̄ = 1.5, ȳ = 4;
  // Sxx = 2.25 + 0.25 + 0.25 + 2.25 = 5; Sxy = (−1.5)(−3) + (−0.5)(−1) + (0.5)(0) + (1.5)(4) = 11;
  // slope = Sxy / Sxx = 2.2; intercept = ȳ − slope·x̄ = 4 − 3.3 = 0.7.
  const fit = new LineFit();
  for (const [x, y] of [[0, 1], [1, 3], [2, 4], [3, 8]] as const) fit.add(x, y);
  expect(fit.slope()).toBeCloseTo(2.2, 12);
  expect(fit.intercept()).toBeCloseTo(0.7, 12);
  expect(fit.count).toBe(4);
});

test("time stamps of a 10-minute record at 25.6 kS/s starting at 10^5 s: the interval to 10^-9 relative", () => {
  // t_k = 100 000 s + k / 25 600 for 15.36 million samples lies exactly on a line (by construction).
  const fit = new LineFit();
  const intervalS = 1 / 25_600;
  for (let k = 0; k < 15_360_000; k++) fit.add(k, 100_000 + k * intervalS);
  expect(Math.abs(fit.slope() / intervalS - 1)).toBeLessThan(1e-9);
  expect(Math.abs(fit.intercept() - 100_000)).toBeLessThan(1e-6);
});

test("fewer than two distinct x give no slope (NaN), not a number", () => {
  const fit = new LineFit();
  fit.add(1, 2);
  fit.add(1, 3);
  expect(fit.slope()).toBeNaN();
});
