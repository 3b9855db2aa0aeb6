import { it } from 'vitest';
import { readFileSync } from 'node:fs';
import { buildModel, solveEquilibrium } from '../src/core/solver/equilibrium';
import { parseScenario } from '../src/core/scenario/parse';
const DEG = Math.PI / 180;
it('try', () => {
  const p = parseScenario(JSON.parse(readFileSync('assets/scenarios/side-hill-stock.json', 'utf8')));
  if (!p.ok) throw new Error();
  const s = p.scenario;
  const m = buildModel(s.vehicle, { features: [] });
  for (const off of [0, 30, -30, 90, 180]) {
    let found = -1;
    for (let a = 0; a < 60 && found < 0; a += 0.5) {
      const r = solveEquilibrium(m, s.pose, { tilt: { angleRad: a * DEG, downhillRad: s.tilt.downhillRad + off * DEG } });
      if (r.standing && r.wheels.some((w) => w.lifted)) found = a;
    }
    console.log('off', off, 'found', found);
  }
});
