// The descent's steps: each attempt is built at the iterate z, whatever trials were refused before it.
import { describe, expect, it } from 'vitest';
import { embedClusterInto } from '../../src/arcs/embed.ts';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { attemptStep, prepareStep, startDescent, takeStep } from '../../src/solver/descent.ts';
import { resolveOptions } from '../../src/solver/options.ts';
import { problemOf } from '../../src/solver/problem.ts';
import { WALL_STRIDE, perimeterInto } from '../../src/solver/wall-terms.ts';
import { workspaceFor } from '../../src/solver/workspace.ts';

describe('descent', () => {
  it('attemptStep: after a refused trial the next attempt reads the wall records of z, not those of the trial', () => {
    // the step of kkt.ts is Newton's step of the model at z (its Hessian and area gradients at z:
    // "Numerical Optimization", 2nd ed., 2006, §18.1); a refused trial must leave no trace in it
    const opt = resolveOptions();
    let refused = 0;
    for (const n of [4, 5, 6]) {
      for (const { map } of enumerateClusters(n)) {
        const problem = problemOf(map);
        const ws = workspaceFor(problem);
        const t0 = 2 * problem.junctions;
        // distinct areas (mean 1), from the barycentric drawing: far from them, so steps get refused
        for (let f = 0; f < n; f++) ws.targets[f] = (2 * (1 + f)) / (n + 1);
        embedClusterInto(map, n, ws.z.subarray(0, t0), ws.z.subarray(t0, t0 + problem.walls));
        const s = startDescent(problem, ws, false);
        const fresh = new Float64Array(problem.walls * WALL_STRIDE);
        const areas = new Float64Array(n);
        for (let step = 0; step < 8; step++) {
          s.iterations++;
          prepareStep(problem, ws, s);
          let outcome = attemptStep(problem, ws, opt, s);
          for (let attempt = 0; attempt < 40 && (outcome === 'raised' || outcome === 'cut'); attempt++) {
            if (outcome === 'cut') {
              refused++;
              perimeterInto(problem, s.z, fresh, areas);
              expect(Array.from(s.cache.subarray(0, fresh.length))).toEqual(Array.from(fresh));
            }
            outcome = attemptStep(problem, ws, opt, s);
          }
          if (outcome !== 'accepted') break;
          takeStep(problem, ws, s);
        }
      }
    }
    // (the check ran: cold starts far from their areas have refused trials)
    expect(refused).toBeGreaterThan(0);
  });
});
