/// <reference lib="webworker" />
/**
 * Ground import off the main thread: reads the dropped file's bytes (GeoTIFF, .asc, PLY, OBJ,
 * GLB/glTF, USDZ, LAS, LAZ, XYZ), runs the pipeline and hands back the grid (its arrays transferred, not
 * copied) and the summary. Progress after each step; cancel = the app terminates this worker.
 */
import { buildGround, GROUND_STEP_COUNT, GroundError, type GroundSettings, type GroundSummary } from '../core/ground/index';
import { readGroundBytes } from '../ground-io/read';
// The LAZ decoder's WebAssembly, bundled by Vite as an asset of the build (served with the app, cached offline).
import lazWasmUrl from 'laz-perf/lib/web/laz-perf.wasm?url';

export interface GroundRequest {
  readonly id: number;
  readonly name: string;
  readonly bytes: ArrayBuffer;
  /** Everything but onStep (functions do not cross to a worker). */
  readonly settings: Omit<GroundSettings, 'onStep'>;
}

export type GroundReply =
  | { readonly id: number; readonly type: 'progress'; readonly done: number; readonly total: number; readonly stage: string }
  | { readonly id: number; readonly type: 'error'; readonly message: string }
  | {
      readonly id: number;
      readonly type: 'ground';
      readonly originM: [number, number];
      readonly cellM: number;
      readonly cols: number;
      readonly rows: number;
      readonly heightsM: Float32Array;
      readonly filled: Uint8Array;
      readonly summary: GroundSummary;
    };

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = async (e: MessageEvent<GroundRequest>) => {
  const req = e.data;
  const post = (m: GroundReply, transfer: Transferable[] = []) => scope.postMessage(m, transfer);
  try {
    post({ id: req.id, type: 'progress', done: 0, total: GROUND_STEP_COUNT, stage: 'reading' });
    const raw = await readGroundBytes(new Uint8Array(req.bytes), req.name, {
      crop: req.settings.crop ?? null,
      lazWasmUrl,
      onProgress: (done, total) => post({ id: req.id, type: 'progress', done: done / total, total: GROUND_STEP_COUNT, stage: `decoding rows ${done} of ${total}` }),
    });
    const res = buildGround(raw, { ...req.settings, onStep: (stage, done) => post({ id: req.id, type: 'progress', done, total: GROUND_STEP_COUNT, stage }) });
    const g = res.grid;
    post(
      { id: req.id, type: 'ground', originM: g.originM, cellM: g.cellM, cols: g.cols, rows: g.rows, heightsM: g.heightsM, filled: g.filled, summary: res.summary },
      [g.heightsM.buffer, g.filled.buffer],
    );
  } catch (err) {
    post({ id: req.id, type: 'error', message: err instanceof GroundError ? err.message : `${req.name}: ${err instanceof Error ? err.message : String(err)}` });
  }
};
