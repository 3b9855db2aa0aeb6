import { useRef, useState } from 'react';
import { version } from '../../../package.json';
import type { HeadingSweepResult } from '../../core';
import { CARD_HEADING_STEP_RAD, cardConfigs, collectCards, renderCardsHtml } from '../../report/card';
import { runHeadings } from '../../worker/client';
import { usePlumb, usePlumbStore } from '../../store/react';

function fileName(name: string, date: string): string {
  const base = name.replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '') || 'vehicle';
  return `${base}-limit-card-${date}.html`;
}

/**
 * The limit card from the app: one printed page per configuration (the vehicle as given, and each
 * build beside it), downloaded as HTML to print or keep; the same card as `plumbline card`. Each
 * configuration's worst heading on the scenario's ground comes from the heading sweep, run in the
 * line sweep's workers (a few seconds a configuration) so the page stays responsive.
 */
export function LimitCardPanel() {
  const store = usePlumbStore();
  const builds = usePlumb((s) => s.scenario.builds?.length ?? 0);
  const [message, setMessage] = useState<string | null>(null);
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const cancelRef = useRef<(() => void) | null>(null);
  const make = async (withBuilds: boolean) => {
    setMessage(null);
    const { scenario: s, units } = store.getState();
    const max = withBuilds ? undefined : 1;
    const configs = cardConfigs(s, max);
    const perConfig = Math.round((2 * Math.PI) / CARD_HEADING_STEP_RAD);
    const total = perConfig * configs.length;
    setProgress({ done: 0, total });
    try {
      const grounds: HeadingSweepResult[] = [];
      for (let i = 0; i < configs.length; i++) {
        const job = runHeadings({ ...s, vehicle: configs[i].vehicle }, CARD_HEADING_STEP_RAD, (d) => setProgress({ done: i * perConfig + d, total }));
        cancelRef.current = job.cancel;
        grounds.push((await job.done).result);
      }
      const dateText = new Date().toISOString().slice(0, 10);
      const cards = collectCards(s, { max, grounds, units });
      const html = renderCardsHtml(cards, { dateText, toolVersion: version, fileName: `${s.name}` });
      const url = URL.createObjectURL(new Blob([html], { type: 'text/html' }));
      const a = document.createElement('a');
      a.href = url;
      a.download = fileName(s.vehicle.name, dateText);
      a.click();
      setTimeout(() => URL.revokeObjectURL(url), 5000);
      setMessage(`Limit card saved: ${cards.length} page${cards.length === 1 ? '' : 's'} (open it and print, A4 or Letter).`);
    } catch (e) {
      setMessage(`Failed: ${(e as Error).message}`);
    } finally {
      cancelRef.current = null;
      setProgress(null);
    }
  };
  const busy = progress !== null;
  return (
    <section className="panel" aria-labelledby="card-h">
      <h2 id="card-h">Limit card</h2>
      <p className="hint">
        One printed page per configuration: the slopes at which it lifts a wheel and tips each way, an operating line, the load assumed, and the worst heading on this
        scenario's ground where the vehicle stands.
      </p>
      <div className="buttons">
        <button type="button" data-testid="card-download" disabled={busy} onClick={() => void make(false)}>
          Limit card of this vehicle
        </button>
        {builds > 0 ? (
          <button type="button" data-testid="card-download-all" disabled={busy} onClick={() => void make(true)}>
            With its {builds} build{builds === 1 ? '' : 's'} beside it
          </button>
        ) : null}
        {busy ? (
          <button type="button" onClick={() => cancelRef.current?.()}>
            Cancel
          </button>
        ) : null}
      </div>
      {progress ? <progress data-testid="card-progress" max={progress.total} value={progress.done} style={{ width: '100%' }} /> : null}
      {message ? (
        <p className="hint" data-testid="card-message">
          {message}
        </p>
      ) : null}
    </section>
  );
}
