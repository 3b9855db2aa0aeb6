/**
 * The imported ground in the scenario file: compact base64 float32 heights, the filled mask and
 * the source record round-trip; a 1000 × 1000 grid saves and opens in under 1 s; features typed
 * afterwards add onto the grid.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseScenarioText, scenarioToFile, TerrainField, type Scenario, type TerrainFeature } from '../../src/core/index';
import { decodeHeights, encodeHeights, HEIGHTS_PREFIX } from '../../src/core/ground/index';

const base = (): Scenario => {
  const r = parseScenarioText(readFileSync(join(__dirname, '..', '..', 'assets', 'scenarios', 'ledge-crawler.json'), 'utf8'));
  if (!r.ok) throw new Error('demo does not parse');
  return r.scenario;
};

function imported(n: number): TerrainFeature & { type: 'grid' } {
  const h = new Float32Array(n * n);
  const mask = new Uint8Array(n * n);
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) {
    h[r * n + c] = 0.3 * Math.sin(c / 37) * Math.cos(r / 23) + 0.001 * ((r * 7 + c * 13) % 17);
    mask[r * n + c] = (r * 31 + c * 17) % 97 === 0 ? 1 : 0;
  }
  return {
    type: 'grid',
    originM: [-(n - 1) * 0.025, -(n - 1) * 0.025],
    spacingM: 0.05,
    cols: n,
    rows: n,
    heightsM: h,
    filledMask: mask,
    source: { file: 'invented-ledge.ply', format: 'ply', crs: null, originSource: [1234.5, -77.25, 3.5], sourceUnitM: 0.001 },
  };
}

describe('imported ground in the scenario file', () => {
  it('a 1000 × 1000 grid saves and opens in under 1 s, heights (float32), mask and source intact', () => {
    const f = imported(1000);
    const s: Scenario = { ...base(), terrain: { features: [f] } };
    const file = join(mkdtempSync(join(tmpdir(), 'plumbline-grid-')), 'big.json');
    // The spec's target: save < 1 s and open < 1 s, measured here in Node (the CLI's path). The
    // best of three tries: other work on a shared machine only ever adds time.
    let save = Infinity;
    let open = Infinity;
    let r = parseScenarioText('{}');
    for (let k = 0; k < 3; k++) {
      const t0 = performance.now();
      writeFileSync(file, JSON.stringify(scenarioToFile(s)));
      const t1 = performance.now();
      r = parseScenarioText(readFileSync(file, 'utf8'));
      const t2 = performance.now();
      save = Math.min(save, t1 - t0);
      open = Math.min(open, t2 - t1);
    }
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(save).toBeLessThan(1000);
    expect(open).toBeLessThan(1000);
    const g = r.scenario.terrain.features[0];
    if (g.type !== 'grid') throw new Error('grid expected');
    expect(g.cols).toBe(1000);
    for (let k = 0; k < f.heightsM.length; k += 997) expect(g.heightsM[k]).toBe(f.heightsM[k]);
    expect(Array.from(g.filledMask ?? []).reduce((a, b) => a + b, 0)).toBe(Array.from(f.filledMask ?? []).reduce((a, b) => a + b, 0));
    expect(g.filledMask?.[0]).toBe(1);
    expect(g.source).toEqual(f.source);
    const text = readFileSync(file, 'utf8');
    // 4 bytes per node in base64: about 5.3 MB for a million nodes.
    expect(text.length).toBeLessThan(6_000_000);
    expect(text).toContain(`"heights":"${HEIGHTS_PREFIX}`);
  });

  it('an imperial file keeps the compact form in feet and reads back the same metres (to float32)', () => {
    const f = imported(40);
    const s: Scenario = { ...base(), units: 'imperial', terrain: { features: [f] } };
    const r = parseScenarioText(JSON.stringify(scenarioToFile(s)));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const g = r.scenario.terrain.features[0];
    if (g.type !== 'grid') throw new Error('grid expected');
    for (let k = 0; k < f.heightsM.length; k++) expect(Math.abs(g.heightsM[k] - f.heightsM[k])).toBeLessThan(1e-6);
  });

  it('a wrong count of compact heights or mask bits is named with its path', () => {
    const file = scenarioToFile({ ...base(), terrain: { features: [imported(10)] } }) as { terrain: { features: Record<string, unknown>[] } };
    const feat = file.terrain.features[0];
    feat.heights = encodeHeights(new Float32Array(99));
    feat.filled = 'AAAA';
    const r = parseScenarioText(JSON.stringify(file));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const msgs = r.errors.map((e) => `${e.path}: ${e.message}`);
    expect(msgs).toContain('terrain.features[0].heights: must hold cols × rows = 100 heights, holds 99');
    expect(msgs).toContain('terrain.features[0].filled: must hold one bit per node (13 bytes), holds 3');
    feat.heights = `${HEIGHTS_PREFIX}@@@@`;
    const r2 = parseScenarioText(JSON.stringify(file));
    expect(!r2.ok && r2.errors.some((e) => e.path === 'terrain.features[0].heights' && /not valid base64/.test(e.message))).toBe(true);
    expect(typeof decodeHeights('nonsense')).toBe('string');
  });

  it('a block typed onto the imported grid adds its height there', () => {
    const f = imported(100);
    const block: TerrainFeature = { type: 'block', xRangeM: [0.5, 1.5], yRangeM: [-0.5, 0.5], heightM: 0.25, edgeRadiusM: 0 };
    const s: Scenario = { ...base(), terrain: { features: [f, block] } };
    const r = parseScenarioText(JSON.stringify(scenarioToFile(s)));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const both = new TerrainField(r.scenario.terrain);
    const gridOnly = new TerrainField({ features: [f] });
    expect(both.height(1, 0) - gridOnly.height(1, 0)).toBeCloseTo(0.25, 9);
    expect(both.height(-1, 0) - gridOnly.height(-1, 0)).toBeCloseTo(0, 9);
  });
});
