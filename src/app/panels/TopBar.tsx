import { useState } from 'react';
import { scenarioToFile, type UnitSystem } from '../../core';
import { shareHash } from '../../store/persist';
import { usePlumb, usePlumbStore } from '../../store/react';

/** Title, units, undo/redo and the scenario file: import, export, share link. */
export function TopBar() {
  const store = usePlumbStore();
  const name = usePlumb((s) => s.scenario.name);
  const units = usePlumb((s) => s.units);
  const canUndo = usePlumb((s) => s.past.length > 0);
  const canRedo = usePlumb((s) => s.future.length > 0);
  const [shareNote, setShareNote] = useState<string | null>(null);

  const exportFile = (): void => {
    const st = store.getState();
    const text = JSON.stringify(scenarioToFile(st.scenario, st.units), null, 2);
    const url = URL.createObjectURL(new Blob([text], { type: 'application/json' }));
    const a = document.createElement('a');
    a.href = url;
    a.download = `${st.scenario.name.replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '') || 'scenario'}.json`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };

  const share = async (): Promise<void> => {
    const url = `${location.origin}${location.pathname}${shareHash(store.getState().scenario)}`;
    history.replaceState(null, '', url);
    try {
      await navigator.clipboard.writeText(url);
      setShareNote('Link copied.');
    } catch {
      setShareNote('Link is in the address bar.');
    }
  };

  return (
    <header className="topbar">
      <h1>Plumbline</h1>
      <span className="scenario-name" data-testid="scenario-name" title={name}>
        {name}
      </span>
      <span className="spacer" />
      <label className="inline">
        Units{' '}
        <select data-testid="units" value={units} onChange={(e) => store.getState().setUnits(e.target.value as UnitSystem)}>
          <option value="metric">metric</option>
          <option value="imperial">imperial</option>
        </select>
      </label>
      <button type="button" data-testid="undo" disabled={!canUndo} onClick={() => store.getState().undo()} title="Undo (Ctrl+Z)">
        Undo
      </button>
      <button type="button" data-testid="redo" disabled={!canRedo} onClick={() => store.getState().redo()} title="Redo (Ctrl+Y)">
        Redo
      </button>
      <label className="file-button">
        Open file…
        <input
          type="file"
          accept=".json,application/json"
          data-testid="scenario-import"
          onChange={async (e) => {
            const f = e.target.files?.[0];
            e.target.value = '';
            if (f) store.getState().importText(await f.text());
          }}
        />
      </label>
      <button type="button" data-testid="scenario-export" onClick={exportFile}>
        Save file
      </button>
      <button type="button" data-testid="share" onClick={() => void share()}>
        Share link
      </button>
      {shareNote ? <span className="share-note">{shareNote}</span> : null}
    </header>
  );
}
