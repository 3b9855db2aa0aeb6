import { useState } from 'react';
import { version } from '../../../package.json';
import { collectCards, renderCardsHtml } from '../../report/card';
import { usePlumb, usePlumbStore } from '../../store/react';

function fileName(name: string, date: string): string {
  const base = name.replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '') || 'vehicle';
  return `${base}-limit-card-${date}.html`;
}

/**
 * The limit card from the app: one printed page per configuration (the vehicle as given, and each
 * build beside it), downloaded as HTML to print or keep; the same card as `plumbline card`.
 */
export function LimitCardPanel() {
  const store = usePlumbStore();
  const builds = usePlumb((s) => s.scenario.builds?.length ?? 0);
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const make = (withBuilds: boolean) => {
    setBusy(true);
    setMessage(null);
    // Let the button show it is busy before the sweeps (a few tilt sweeps per configuration, well under a second).
    setTimeout(() => {
      try {
        const s = store.getState().scenario;
        const dateText = new Date().toISOString().slice(0, 10);
        const cards = collectCards(s, { max: withBuilds ? undefined : 1 });
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
        setBusy(false);
      }
    }, 0);
  };
  return (
    <section className="panel" aria-labelledby="card-h">
      <h2 id="card-h">Limit card</h2>
      <p className="hint">One printed page per configuration: the slopes at which it lifts a wheel and tips each way, an operating line, the load assumed.</p>
      <div className="buttons">
        <button type="button" data-testid="card-download" disabled={busy} onClick={() => make(false)}>
          Limit card of this vehicle
        </button>
        {builds > 0 ? (
          <button type="button" data-testid="card-download-all" disabled={busy} onClick={() => make(true)}>
            With its {builds} build{builds === 1 ? '' : 's'} beside it
          </button>
        ) : null}
      </div>
      {message ? (
        <p className="hint" data-testid="card-message">
          {message}
        </p>
      ) : null}
    </section>
  );
}
