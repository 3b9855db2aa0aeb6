import { useEffect, useRef, useState } from 'react';
import { version } from '../../../package.json';
import { runJob, type Job } from '../../worker/client';
import type { ReplyOf } from '../../worker/messages';
import { usePlumbStore } from '../../store/react';

/** The picture of the 3D view for the report: JPEG keeps a 1280×720 view near 100 kB. */
function sceneImage(): string | null {
  const c = document.querySelector('[data-testid="scene"] canvas') as HTMLCanvasElement | null;
  if (!c) return null;
  try {
    // The canvas keeps its drawing buffer (preserveDrawingBuffer), so this is the frame on screen.
    const url = c.toDataURL('image/jpeg', 0.85);
    return url.startsWith('data:image/jpeg;base64,') ? url : null;
  } catch {
    return null;
  }
}

function fileName(name: string, date: string): string {
  const base = name.replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '') || 'scenario';
  return `${base}-report-${date}.html`;
}

/**
 * The report: every analysis of the scenario (as the CLI's report), made in a worker, as one
 * self-contained HTML file with a picture of the 3D view; downloaded.
 */
export function ReportPanel() {
  const store = usePlumbStore();
  const [stage, setStage] = useState<string | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const job = useRef<Job<ReplyOf<'report'>> | null>(null);
  useEffect(() => () => job.current?.cancel(), []);
  const start = () => {
    const { scenario: s, units } = store.getState();
    const dateText = new Date().toISOString().slice(0, 10);
    setMessage(null);
    setStage('starting');
    const j = runJob({ type: 'report', scenario: s, toolVersion: version, dateText, sceneImageDataUrl: sceneImage(), units }, (_d, _t, st) => setStage(st ?? null));
    job.current = j;
    j.done
      .then((r) => {
        const url = URL.createObjectURL(new Blob([r.html], { type: 'text/html' }));
        const a = document.createElement('a');
        a.href = url;
        a.download = fileName(s.name, dateText);
        a.click();
        setTimeout(() => URL.revokeObjectURL(url), 5000);
        setMessage(`Report saved (${(r.html.length / 1024).toFixed(0)} kB, ${(r.wallMs / 1000).toFixed(1)} s).`);
      })
      .catch((e: Error) => setMessage(e.message === 'cancelled' ? 'Cancelled.' : `Failed: ${e.message}`))
      .finally(() => {
        if (job.current === j) job.current = null;
        setStage(null);
      });
  };
  return (
    <section className="panel" aria-labelledby="report-h">
      <h2 id="report-h">Report</h2>
      <p className="hint">One HTML file to keep or print, in the units chosen above: the loads, the tilt table each way, the rose, the pass, the builds and the cautions, with a picture of the 3D view as it is now.</p>
      <div className="buttons">
        <button type="button" data-testid="report-button" disabled={stage !== null} onClick={start}>
          {stage ? `Working: ${stage}…` : 'Make the report'}
        </button>
        {stage ? (
          <button type="button" data-testid="report-cancel" onClick={() => job.current?.cancel()}>
            Cancel
          </button>
        ) : null}
      </div>
      {message ? (
        <p className="hint" data-testid="report-note">
          {message}
        </p>
      ) : null}
    </section>
  );
}
