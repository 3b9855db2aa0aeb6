import { it } from 'vitest';
import { readFileSync } from 'node:fs';
import { buildModel, solveEquilibrium } from '../src/core/solver/equilibrium';
import { initialGuess } from '../src/core/solver/newton';
it('try', () => {
  for (const line of readFileSync('/tmp/solver/cases.json', 'utf8').trim().split('\n')) {
    const c = JSON.parse(line);
    const m = buildModel(c.vehicle, c.terrain);
    for (const dz of [-0.05, -0.02, 0.02, 0.05, 0.1, 0.2]) {
      m.setPose(c.pose.xM, c.pose.yM, c.pose.headingRad); m.setTilt(0, 0);
      const x = new Float64Array(10); initialGuess(m, x); x[0] += dz;
      const r = solveEquilibrium(m, c.pose, { tilt: c.tilt, warmStart: x, followBranch: true });
      console.log(dz, r.status, r.reason.slice(0, 80), r.iterations, r.wheels.map((w: any) => w.lifted ? 'L' : '-').join(''));
    }
  }
});
