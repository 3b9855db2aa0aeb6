import { useEffect, useRef, useState } from 'react';
import { scenarioOnGround, LENGTH_UNITS_M, type GroundSummary, type HeightGrid } from '../../core/ground/index';
import type { GroundReply, GroundRequest } from '../../worker/groundWorker';
import { unitLabel } from '../../core';
import { usePlumb, usePlumbStore } from '../../store/react';

type UnitChoice = 'file' | keyof typeof LENGTH_UNITS_M;
const UNIT_CHOICES: readonly UnitChoice[] = ['file', 'm', 'cm', 'mm', 'ft', 'in'];
import { M_PER_IN as IN_M } from '../../present/units';

interface Imported {
  readonly name: string;
  readonly grid: HeightGrid;
  readonly summary: GroundSummary;
}

let nextId = 1;

/** File names the ground import takes (a dropped scenario .json is not one of them). */
const GROUND_FILE = /\.(tif|tiff|asc|ply|obj|glb|gltf|usdz|las|laz|xyz|csv|txt|pts)$/i;

/**
 * Real ground from a file (pick it or drop it on this box): a GeoTIFF or ASCII elevation model,
 * a phone-scan mesh (PLY, OBJ, GLB/glTF, USDZ), a LAS, LAZ or XYZ point cloud. Read and gridded in a Web
 * Worker with progress and cancel; a preview (filled cells tinted) and what was done, then "Stand
 * on this ground" replaces the terrain. A bad file leaves the scenario as it was.
 */
export function GroundImport() {
  const store = usePlumbStore();
  const units = usePlumb((s) => s.units);
  const lengthUnit = unitLabel('length', units);
  const [file, setFile] = useState<File | null>(null);
  const [unit, setUnit] = useState<UnitChoice>('file');
  const [up, setUp] = useState<'file' | 'z' | 'y'>('file');
  const [cellText, setCellText] = useState('');
  const [cropText, setCropText] = useState('');
  const [level, setLevel] = useState(false);
  const [fill, setFill] = useState(true);
  const [progress, setProgress] = useState<{ done: number; total: number; stage: string } | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [result, setResult] = useState<Imported | null>(null);
  const worker = useRef<Worker | null>(null);
  const canvas = useRef<HTMLCanvasElement | null>(null);
  const box = useRef<HTMLFieldSetElement | null>(null);
  useEffect(() => () => worker.current?.terminate(), []);

  const settingsError = (): string | null => {
    if (cellText.trim() !== '' && !(Number(cellText) > 0)) return `Cell must be a length > 0 in ${lengthUnit}, or blank for automatic.`;
    if (cropText.trim() !== '') {
      const p = cropText.split(',').map((v) => Number(v.trim()));
      if (p.length !== 4 || p.some((v) => !Number.isFinite(v))) return 'Crop must be x0, y0, x1, y1 in the file\'s own coordinates, or blank.';
    }
    return null;
  };

  const start = async (f: File) => {
    const bad = settingsError();
    if (bad) {
      setMessage(bad);
      return;
    }
    worker.current?.terminate();
    setResult(null);
    setMessage(null);
    setProgress({ done: 0, total: 1, stage: 'reading the file' });
    const bytes = await f.arrayBuffer();
    const cell = cellText.trim() === '' ? undefined : Number(cellText) * (units === 'metric' ? 1 : IN_M);
    const crop = cropText.trim() === '' ? null : (cropText.split(',').map((v) => Number(v.trim())) as [number, number, number, number]);
    const w = new Worker(new URL('../../worker/groundWorker.ts', import.meta.url), { type: 'module' });
    worker.current = w;
    const id = nextId++;
    w.onmessage = (e: MessageEvent<GroundReply>) => {
      const m = e.data;
      if (m.id !== id) return;
      if (m.type === 'progress') setProgress({ done: m.done, total: m.total, stage: m.stage });
      else {
        w.terminate();
        worker.current = null;
        setProgress(null);
        if (m.type === 'error') setMessage(m.message);
        else setResult({ name: f.name, summary: m.summary, grid: { kind: 'grid', originM: m.originM, cellM: m.cellM, cols: m.cols, rows: m.rows, heightsM: m.heightsM, filled: m.filled } });
      }
    };
    w.onerror = (e) => {
      w.terminate();
      worker.current = null;
      setProgress(null);
      setMessage(`${f.name}: ${e.message || 'the import failed'}`);
    };
    const req: GroundRequest = {
      id,
      name: f.name,
      bytes,
      settings: { cellM: cell, unitM: unit === 'file' ? undefined : LENGTH_UNITS_M[unit], up: up === 'file' ? undefined : up, crop, level, fill },
    };
    w.postMessage(req, [bytes]);
  };

  // A ground file dropped anywhere on the page (the 3D view included) is imported here.
  const startRef = useRef(start);
  startRef.current = start;
  useEffect(() => {
    const isFiles = (e: DragEvent) => Array.from(e.dataTransfer?.types ?? []).includes('Files');
    const over = (e: DragEvent) => {
      if (isFiles(e)) e.preventDefault();
    };
    const drop = (e: DragEvent) => {
      const f = e.dataTransfer?.files?.[0];
      if (!f || !GROUND_FILE.test(f.name) || e.defaultPrevented) return;
      e.preventDefault();
      const details = box.current?.closest('details');
      if (details) details.open = true;
      box.current?.scrollIntoView({ block: 'nearest' });
      setFile(f);
      void startRef.current(f);
    };
    window.addEventListener('dragover', over);
    window.addEventListener('drop', drop);
    return () => {
      window.removeEventListener('dragover', over);
      window.removeEventListener('drop', drop);
    };
  }, []);

  const cancel = () => {
    worker.current?.terminate();
    worker.current = null;
    setProgress(null);
    setMessage('Cancelled; the scenario is unchanged.');
  };

  // Preview: hill shading from above (light from the north-west), filled cells tinted orange.
  useEffect(() => {
    const c = canvas.current;
    if (!c || !result) return;
    const g = result.grid;
    const scale = Math.max(1, Math.ceil(Math.max(g.cols, g.rows) / 240));
    const w = Math.ceil(g.cols / scale);
    const h = Math.ceil(g.rows / scale);
    c.width = w;
    c.height = h;
    const ctx = c.getContext('2d');
    if (!ctx) return;
    const img = ctx.createImageData(w, h);
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of g.heightsM) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    const at = (cc: number, rr: number) => g.heightsM[Math.min(g.rows - 1, Math.max(0, rr)) * g.cols + Math.min(g.cols - 1, Math.max(0, cc))];
    for (let y = 0; y < h; y++) {
      for (let x = 0; x < w; x++) {
        const cc = x * scale;
        const rr = (h - 1 - y) * scale; // north up
        const dx = (at(cc + scale, rr) - at(cc - scale, rr)) / (2 * scale * g.cellM);
        const dy = (at(cc, rr + scale) - at(cc, rr - scale)) / (2 * scale * g.cellM);
        const shade = Math.max(0, Math.min(1, 0.6 + 0.6 * (-dx + dy) / Math.sqrt(1 + dx * dx + dy * dy)));
        const t = hi > lo ? (at(cc, rr) - lo) / (hi - lo) : 0.5;
        const base = 90 + 120 * t;
        const filled = g.filled[Math.min(g.rows - 1, rr) * g.cols + Math.min(g.cols - 1, cc)] === 1;
        const k = 4 * (y * w + x);
        img.data[k] = filled ? 240 * shade : base * shade;
        img.data[k + 1] = filled ? 150 * shade : base * shade;
        img.data[k + 2] = filled ? 40 * shade : base * shade;
        img.data[k + 3] = 255;
      }
    }
    ctx.putImageData(img, 0, 0);
  }, [result]);

  const apply = () => {
    if (!result) return;
    const st = store.getState();
    st.replaceScenario(scenarioOnGround(st.scenario, { grid: result.grid, summary: result.summary }));
    const s = result.summary;
    store.setState({
      importErrors: null,
      importWarnings: [
        `The vehicle now stands on ${s.file}: a ${s.cols} × ${s.rows} grid${s.filledShare > 0 ? `, ${(100 * s.filledShare).toFixed(1)} % of it filled in (not measured)` : ''}.`,
        ...s.warnings,
      ],
    });
    setResult(null);
  };

  const len = (m: number) => (units === 'metric' ? `${Number(m.toPrecision(3))} m` : `${Number((m / IN_M).toPrecision(3))} in`);
  const s = result?.summary;
  return (
    <fieldset
      className="group"
      data-testid="ground-import"
      ref={box}
    >
      <legend>Real ground from a file</legend>
      <p className="fineprint">GeoTIFF or ASCII elevation model, a scan mesh (PLY, OBJ, GLB/glTF, USDZ), a LAS, LAZ or XYZ point cloud. Pick it, or drop it anywhere on the page.</p>
      <div className="row">
        <label className="field">
          <span className="field-label">Length unit</span>
          <select data-testid="ground-unit" value={unit} onChange={(e) => setUnit(e.target.value as UnitChoice)}>
            {UNIT_CHOICES.map((u) => (
              <option key={u} value={u}>
                {u === 'file' ? 'as the file says (else m)' : u}
              </option>
            ))}
          </select>
        </label>
        <label className="field">
          <span className="field-label">Up axis</span>
          <select data-testid="ground-up" value={up} onChange={(e) => setUp(e.target.value as 'file' | 'z' | 'y')}>
            <option value="file">as the file says (else z)</option>
            <option value="z">z</option>
            <option value="y">y</option>
          </select>
        </label>
        <label className="field">
          <span className="field-label">Cell ({lengthUnit}, blank: automatic)</span>
          <input data-testid="ground-cell" value={cellText} onChange={(e) => setCellText(e.target.value)} inputMode="decimal" />
        </label>
        <label className="field">
          <span className="field-label">Crop x0, y0, x1, y1 (file coordinates)</span>
          <input data-testid="ground-crop" value={cropText} onChange={(e) => setCropText(e.target.value)} />
        </label>
      </div>
      <div className="row">
        <label>
          <input type="checkbox" data-testid="ground-level" checked={level} onChange={(e) => setLevel(e.target.checked)} /> Level a scan (no georeference)
        </label>
        <label>
          <input type="checkbox" data-testid="ground-fill" checked={fill} onChange={(e) => setFill(e.target.checked)} /> Fill holes (marked)
        </label>
      </div>
      <label className="file-button light">
        Choose a ground file…
        <input
          type="file"
          data-testid="ground-file"
          accept=".tif,.tiff,.asc,.ply,.obj,.glb,.gltf,.usdz,.las,.laz,.xyz,.csv,.txt,.pts"
          onChange={(e) => {
            const f = e.target.files?.[0];
            e.target.value = '';
            if (f) {
              setFile(f);
              void start(f);
            }
          }}
        />
      </label>
      {file && !progress && !result ? (
        <button type="button" data-testid="ground-rerun" onClick={() => void start(file)}>
          Read {file.name} again with these settings
        </button>
      ) : null}
      {progress ? (
        <div>
          <progress data-testid="ground-progress" max={progress.total} value={progress.done} style={{ width: '100%' }} />
          <span className="fineprint">{progress.stage}</span>{' '}
          <button type="button" data-testid="ground-cancel" onClick={cancel}>
            Cancel
          </button>
        </div>
      ) : null}
      {message ? (
        <p className="fineprint" data-testid="ground-message" role="alert">
          {message}
        </p>
      ) : null}
      {result && s ? (
        <div data-testid="ground-preview">
          <canvas ref={canvas} style={{ width: '100%', maxWidth: 320, imageRendering: 'pixelated', border: '1px solid #8a939c' }} />
          <p className="fineprint">
            {s.file} ({s.format}
            {s.crs ? `, ${s.crs}` : ''}): {s.trianglesRead > 0 ? `${s.pointsRead} vertices` : s.pointsRead > 0 ? `${s.pointsRead} points` : s.cellsRead > 0 ? `${s.cellsRead} cells` : ''}
            {s.trianglesRead > 0 ? `, ${s.trianglesRead} triangles` : ''} read; {s.outliersRemoved} outliers removed
            {s.groundFilterRemoved > 0 ? `, ${s.groundFilterRemoved} off-ground points removed` : ''}; grid {s.cols} × {s.rows} at {len(s.cellM)} ({s.cellWhy}); {(100 * s.filledShare).toFixed(1)} % filled (orange)
            {s.levellingDeg !== null ? `; levelled by ${s.levellingDeg.toFixed(1)}° (fitted ground plane to level)` : ''}.
          </p>
          {s.warnings.map((w) => (
            <p key={w} className="fineprint" role="alert">
              {w}
            </p>
          ))}
          <button type="button" data-testid="ground-apply" onClick={apply}>
            Stand on this ground
          </button>{' '}
          <button type="button" onClick={() => setResult(null)}>
            Discard
          </button>
        </div>
      ) : null}
    </fieldset>
  );
}
