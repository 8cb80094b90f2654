// The precomputed grids (lib/frontends/grid-data.ts) must be what the simulations give today;
// regenerate with `npx tsx scripts/generate-frontend-grids.ts` when this fails.
import { expect, test } from "vitest";
import { SIMULATED_GRIDS } from "@/lib/frontends/families";
import { decodeGrid, PRECOMPUTED_GRIDS } from "@/lib/frontends/grid-data";

test.each(Object.keys(SIMULATED_GRIDS))("%s: stored grid matches its axes and fresh simulations at sample points", (key) => {
  const { axes, compute } = SIMULATED_GRIDS[key]!;
  const grid = decodeGrid(PRECOMPUTED_GRIDS[key], axes);
  expect(grid, "stored grid missing or its axes differ: regenerate grid-data.ts").not.toBeNull();
  const sizes = axes.map((a) => a.length);
  const total = sizes.reduce((a, b) => a * b, 1);
  for (const index of [0, Math.floor(total / 3), Math.floor((2 * total) / 3), total - 1]) {
    let rest = index;
    const point: number[] = new Array(axes.length);
    for (let d = axes.length - 1; d >= 0; d--) {
      point[d] = axes[d]![rest % sizes[d]!]!;
      rest = Math.floor(rest / sizes[d]!);
    }
    const fresh = compute(point);
    for (const h of [1, 3, 5, 7, 11, 13, 25]) {
      const re = fresh.magnitude[h]! * Math.cos(fresh.phaseRad[h]!);
      const im = fresh.magnitude[h]! * Math.sin(fresh.phaseRad[h]!);
      expect(grid!.re[index]![h]).toBeCloseTo(re, 4);
      expect(grid!.im[index]![h]).toBeCloseTo(im, 4);
    }
  }
});
