/**
 * USDZ round trip with a known answer: the analytic `rock` and `step` features sampled into a
 * triangle mesh (the PLY round trip's lattice, tests/ground/analytic.ts), turned Y up and placed
 * under a moved parent as a three scene, written by three's own USDZExporter (three 0.187,
 * examples/jsm/exporters/USDZExporter.js: an outside writer, not Plumbline's), read back through
 * the USDZ reader (three's USDLoader), gridded, and checked against the analytic heights (within
 * the relief of the true surface over one cell, plus 1 mm) and against the vehicle's tyre loads on
 * the analytic features (every wheel within 1 % of the weight, as the PLY round trip).
 *
 * Bad USDZ input: a message naming the file and the problem within a second.
 */
import { BufferAttribute, BufferGeometry, Group, Mesh, MeshStandardMaterial, Scene } from 'three';
import { USDZExporter } from 'three/examples/jsm/exporters/USDZExporter.js';
import { strToU8, zipSync } from 'three/examples/jsm/libs/fflate.module.js';
import { describe, expect, it } from 'vitest';
import { buildModel, solveEquilibrium, TerrainField, type Terrain, type TerrainFeature } from '../../src/core/index';
import { buildGround, groundFeature } from '../../src/core/ground/index';
import { readGroundBytes } from '../../src/ground-io/read';
import { testVehicle } from '../helpers/vehicles';
import { sample, triangulate } from './analytic';
import { plyMesh } from './plyWrite';
import { expectRefusal } from './refusal';

/** Plumbline's z-up metres → a three (Y up) scene, the mesh's vertices shifted by −shift and its parent by +shift in x. */
async function usdzOf(terrain: Terrain, shiftM = 10): Promise<Uint8Array> {
  const { pos, cols, rows } = sample(terrain);
  const yUp = new Float32Array(pos.length);
  for (let i = 0; i < pos.length; i += 3) {
    yUp[i] = pos[i] - shiftM;
    yUp[i + 1] = pos[i + 2];
    yUp[i + 2] = -pos[i + 1];
  }
  const g = new BufferGeometry();
  g.setAttribute('position', new BufferAttribute(yUp, 3));
  g.setIndex(new BufferAttribute(triangulate(cols, rows), 1));
  g.computeVertexNormals();
  const parent = new Group();
  parent.position.x = shiftM;
  parent.add(new Mesh(g, new MeshStandardMaterial()));
  const scene = new Scene();
  scene.add(parent);
  scene.updateMatrixWorld(true);
  return new USDZExporter().parseAsync(scene);
}

const cases: { name: string; features: TerrainFeature[] }[] = [
  // A dome under the front-left tyre (front axle at x = +1.4 m, left wheels at y = +0.8 m).
  { name: 'rock', features: [{ type: 'rock', xM: 1.4, yM: 0.8, heightM: 0.3, radiusM: 0.7 }] },
  // The left side up a 0.15 m ledge whose edge runs along x, 0.8 m from the tyres.
  { name: 'step', features: [{ type: 'step', xM: -3, heightM: 0.15, yRangeM: [0, 3], edgeRadiusM: 0 }] },
];

describe('analytic features → three USDZExporter → USDZ reader → grid', () => {
  for (const c of cases) {
    it(`${c.name}: heights within one cell's relief + 1 mm, every wheel within 1 % of the weight`, async () => {
      const terrain: Terrain = { features: c.features };
      const bytes = await usdzOf(terrain);
      const raw = await readGroundBytes(bytes, `${c.name}.usdz`);
      expect(raw.kind).toBe('mesh');
      expect(raw.info.format).toBe('usdz');
      expect(raw.info.up).toBe('y');
      const lattice = sample(terrain);
      if (raw.kind === 'mesh') {
        // Welded back to the lattice: one vertex a lattice point, two triangles a lattice square.
        expect(raw.vertexCount).toBe(lattice.cols * lattice.rows);
        expect(raw.triangleCount).toBe(2 * (lattice.cols - 1) * (lattice.rows - 1));
      }
      const cellM = 0.02;
      const res = buildGround(raw, { cellM, fill: true });
      expect(res.summary.cellM).toBe(cellM);
      expect(res.summary.up).toBe('y');
      // Heights at the grid nodes against the analytic surface, in the source frame.
      const truth = new TerrainField(terrain);
      const g = res.grid;
      const o = res.summary.originSource;
      let worst = 0;
      let checked = 0;
      for (let r = 1; r < g.rows - 1; r++) {
        for (let col = 1; col < g.cols - 1; col++) {
          const x = g.originM[0] + col * cellM + o.x;
          const y = g.originM[1] + r * cellM + o.y;
          let lo = Infinity;
          let hi = -Infinity;
          for (let dy = -1; dy <= 1; dy++) for (let dx = -1; dx <= 1; dx++) {
            const h = truth.height(x + dx * cellM, y + dy * cellM);
            lo = Math.min(lo, h);
            hi = Math.max(hi, h);
          }
          const err = Math.abs(g.heightsM[r * g.cols + col] + o.z - truth.height(x, y));
          expect(err, `node (${col}, ${r}) at (${x.toFixed(3)}, ${y.toFixed(3)})`).toBeLessThanOrEqual(hi - lo + 0.001);
          worst = Math.max(worst, err);
          checked++;
        }
      }
      expect(checked).toBeGreaterThan(30_000);
      // The same lattice as a binary PLY (float32, no text rounding) through the PLY reader: the same
      // grid but for the exporter's text (7 significant digits, ≤ 13 µm in x at 12.6 m from the
      // parent), which can tip a node on the dome's near-vertical rim to another triangle's top:
      // measured 2 nodes of 42 021 (≤ 7.2 mm) for the rock, none for the step. At most 1 in 10 000.
      const ply = buildGround(await readGroundBytes(plyMesh(lattice.pos, triangulate(lattice.cols, lattice.rows)), `${c.name}.ply`), { cellM, fill: true });
      expect(ply.grid.cols).toBe(g.cols);
      expect(ply.grid.rows).toBe(g.rows);
      let vsPly = 0;
      let apart = 0;
      for (let k = 0; k < g.heightsM.length; k++) {
        const d = Math.abs(g.heightsM[k] + o.z - ply.grid.heightsM[k] - ply.summary.originSource.z);
        if (d > 1e-4) apart++;
        vsPly = Math.max(vsPly, d);
      }
      expect(apart).toBeLessThanOrEqual(Math.ceil(g.heightsM.length / 10_000));
      if (process.env.GROUND_SHOW_MESSAGES) console.log(`${c.name}.usdz: ${checked} nodes, largest height error ${(worst * 1000).toFixed(2)} mm (against the analytic surface), ${apart} nodes more than 0.1 mm from the PLY of the same lattice (largest ${(vsPly * 1000).toFixed(4)} mm)`);
      // Loads on the imported ground against the analytic features.
      const imported: Terrain = { features: [groundFeature(res)] };
      const v = testVehicle();
      const pose = { xM: 0, yM: 0, headingRad: 0 };
      const a = solveEquilibrium(buildModel(v, terrain), pose);
      const b = solveEquilibrium(buildModel(v, imported), pose);
      expect(a.status).toBe('converged');
      expect(b.status).toBe('converged');
      const spread = Math.max(...a.wheels.map((w) => w.loadN!)) - Math.min(...a.wheels.map((w) => w.loadN!));
      expect(spread).toBeGreaterThan(0.05 * a.weightN);
      for (let w = 0; w < 4; w++) expect(Math.abs(a.wheels[w].loadN! - b.wheels[w].loadN!), a.wheels[w].name).toBeLessThan(0.01 * a.weightN);
      if (process.env.GROUND_SHOW_MESSAGES) console.log(`${c.name}.usdz: largest wheel-load difference ${((100 * Math.max(...a.wheels.map((w, k) => Math.abs(w.loadN! - b.wheels[k].loadN!)))) / a.weightN).toFixed(3)} % of the weight`);
    }, 120_000);
  }
});

const usda = (body: string) => strToU8(`#usda 1.0\n(\n    metersPerUnit = 1\n    upAxis = "Y"\n)\n\n${body}\n`);

describe('stage units and up axis (USD stage metadata: metersPerUnit, upAxis; AOUSD Core Specification 1.0.1)', () => {
  it('a Z-up stage in centimetres comes out in metres, Y up, and grids at the right height', async () => {
    // A 100 cm square at z = 50 cm, Z up: in metres Y up it is x ∈ [0, 1], y = 0.5, z ∈ [−1, 0].
    const stage = strToU8(
      '#usda 1.0\n(\n    metersPerUnit = 0.01\n    upAxis = "Z"\n)\n\ndef Xform "Root"\n{\n    def Mesh "Square"\n    {\n' +
        '        int[] faceVertexCounts = [3, 3]\n        int[] faceVertexIndices = [0, 1, 2, 0, 2, 3]\n' +
        '        point3f[] points = [(0, 0, 50), (100, 0, 50), (100, 100, 50), (0, 100, 50)]\n    }\n}\n',
    );
    const raw = await readGroundBytes(zipSync({ 'square.usda': stage }, { level: 0 }), 'square.usdz');
    expect(raw.kind).toBe('mesh');
    if (raw.kind !== 'mesh') return;
    expect(raw.vertexCount).toBe(4);
    expect(raw.triangleCount).toBe(2);
    const p = Array.from(raw.positions);
    for (let i = 0; i < 4; i++) {
      expect(p[3 * i]).toBeGreaterThanOrEqual(-1e-9);
      expect(p[3 * i]).toBeLessThanOrEqual(1 + 1e-9);
      expect(p[3 * i + 1]).toBeCloseTo(0.5, 9);
      expect(p[3 * i + 2]).toBeGreaterThanOrEqual(-1 - 1e-9);
      expect(p[3 * i + 2]).toBeLessThanOrEqual(1e-9);
    }
    const res = buildGround(raw, { cellM: 0.1, fill: true, outliers: false });
    expect(res.summary.up).toBe('y');
    expect(res.summary.unitM).toBe(1);
    for (let k = 0; k < res.grid.heightsM.length; k++) expect(res.grid.heightsM[k] + res.summary.originSource.z).toBeCloseTo(0.5, 6);
  });
});

describe('a textured scan (a phone scan\'s USDZ carries its photo texture)', () => {
  it('reads its mesh; the texture, which cannot load without a DOM, leaves no unhandled rejection', async () => {
    // UsdPreviewSurface with a UsdUVTexture (USD's preview material schema) on the mesh, a PNG in the archive.
    const stage = strToU8(
      '#usda 1.0\n(\n    metersPerUnit = 1\n    upAxis = "Y"\n)\n\ndef Xform "Root"\n{\n' +
        '    def Mesh "Ground" (\n        prepend apiSchemas = ["MaterialBindingAPI"]\n    )\n    {\n' +
        '        int[] faceVertexCounts = [3, 3]\n        int[] faceVertexIndices = [0, 1, 2, 0, 2, 3]\n' +
        '        point3f[] points = [(0, 0, 0), (1, 0, 0), (1, 0, -1), (0, 0, -1)]\n' +
        '        texCoord2f[] primvars:st = [(0, 0), (1, 0), (1, 1), (0, 1)] (\n            interpolation = "vertex"\n        )\n' +
        '        rel material:binding = </Root/Mat>\n    }\n\n' +
        '    def Material "Mat"\n    {\n        token outputs:surface.connect = </Root/Mat/PreviewSurface.outputs:surface>\n' +
        '        def Shader "PreviewSurface"\n        {\n            uniform token info:id = "UsdPreviewSurface"\n' +
        '            color3f inputs:diffuseColor.connect = </Root/Mat/Tex.outputs:rgb>\n            token outputs:surface\n        }\n' +
        '        def Shader "Tex"\n        {\n            uniform token info:id = "UsdUVTexture"\n            asset inputs:file = @textures/t.png@\n' +
        '            float2 inputs:st.connect = </Root/Mat/St.outputs:result>\n            float3 outputs:rgb\n        }\n' +
        '        def Shader "St"\n        {\n            uniform token info:id = "UsdPrimvarReader_float2"\n            token inputs:varname = "st"\n            float2 outputs:result\n        }\n' +
        '    }\n}\n',
    );
    const png = new Uint8Array([137, 80, 78, 71, 13, 10, 26, 10]);
    const rejections: unknown[] = [];
    const onRejection = (e: unknown) => void rejections.push(e);
    process.on('unhandledRejection', onRejection);
    try {
      const raw = await readGroundBytes(zipSync({ 'model.usda': stage, 'textures/t.png': png }, { level: 0 }), 'textured.usdz');
      expect(raw.kind === 'mesh' && raw.triangleCount).toBe(2);
      await new Promise((r) => setTimeout(r, 300));
    } finally {
      process.off('unhandledRejection', onRejection);
    }
    expect(rejections.map(String)).toEqual([]);
  });
});

describe('bad USDZ files: a clear message naming the file, within a second', () => {
  const small = () =>
    zipSync(
      {
        'model.usda': usda('def Xform "Root"\n{\n    def Mesh "Ground"\n    {\n        int[] faceVertexCounts = [3]\n        int[] faceVertexIndices = [0, 1, 2]\n        point3f[] points = [(0, 0, 0), (1, 0, 0), (0, 0, -1)]\n    }\n}'),
      },
      { level: 0 },
    );
  const cases: { name: string; file: string; bytes: () => Uint8Array; message: RegExp }[] = [
    { name: 'not a zip archive', file: 'x.usdz', bytes: () => strToU8('#usda 1.0\n'), message: /not a USDZ file \(a USDZ is a zip archive/ },
    { name: 'a truncated archive', file: 'cut.usdz', bytes: () => small().subarray(0, small().length - 30), message: /the zip archive cannot be opened .*truncated or damaged/ },
    { name: 'an archive whose first entry is an image', file: 'img.usdz', bytes: () => zipSync({ 'a.png': new Uint8Array(16), 'model.usda': usda('') }, { level: 0 }), message: /the first entry of the archive is "a\.png", not a USD layer/ },
    { name: 'a stage with no meshes', file: 'empty.usdz', bytes: () => zipSync({ 'model.usda': usda('def Xform "Root"\n{\n}') }, { level: 0 }), message: /holds 0 meshes and no triangles/ },
    {
      name: 'an archive that claims to unpack to 4 GB',
      file: 'bomb.usdz',
      bytes: () => {
        const b = small().slice();
        const dv = new DataView(b.buffer);
        // The central directory entry (signature PK\1\2) gives the uncompressed size at +24 (PKWARE APPNOTE 6.3.10 §4.3.12).
        for (let k = b.length - 22; k >= 0; k--) if (dv.getUint32(k, true) === 0x02014b50) {
          dv.setUint32(k + 24, 0xf0000000, true);
          break;
        }
        return b;
      },
      message: /the archive unpacks to 4,026,531,840 bytes, more than the 1,073,741,824 this import takes/,
    },
  ];
  it('the small good archive reads (the cases below are that archive damaged)', async () => {
    const raw = await readGroundBytes(small(), 'ok.usdz');
    expect(raw.kind === 'mesh' && raw.triangleCount).toBe(1);
  });
  for (const c of cases) {
    it(c.name, async () => {
      const bytes = c.bytes();
      await expectRefusal(c.file, c.message, async () => buildGround(await readGroundBytes(bytes, c.file)));
    });
  }
});
