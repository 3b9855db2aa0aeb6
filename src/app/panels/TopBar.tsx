import { useState } from 'react';
import { useStore } from 'zustand';
import { SCENARIO_LIMITS, scenarioToFile, type UnitSystem } from '../../core';
import { shareLink, type SaveStatus } from '../../store/persist';
import { session } from '../../store/session';
import { createStore } from 'zustand/vanilla';
import { usePlumb, usePlumbStore } from '../../store/react';

/** Stands in for the save status before the autosave starts (never changes). */
const NO_STATUS = createStore<SaveStatus>()(() => ({ state: 'saved', where: null, rev: 0, newer: null, failure: null }));

/** Notes about this visit: a link opened, another tab's newer work, a failed save, a new version. */
function SessionNotes() {
  const store = usePlumbStore();
  const linkOpened = useStore(session, (s) => s.linkOpened);
  const updateReady = useStore(session, (s) => s.updateReady);
  const controller = useStore(session, (s) => s.autosave);
  const status = useStore(controller?.status ?? NO_STATUS);
  const time = (ms: number) => new Date(ms).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' });
  return (
    <>
      {linkOpened ? (
        <div className="session-note" role="status" data-testid="link-opened">
          Opened a shared link: {linkOpened.name}.{' '}
          {linkOpened.keptAs ? <>Your earlier work is kept in the garage as “{linkOpened.keptAs}” and is one Undo away. </> : null}
          <button
            type="button"
            data-testid="link-keep-mine"
            disabled={!linkOpened.keptAs && store.getState().past.length === 0}
            onClick={() => {
              store.getState().undo();
              session.setState({ linkOpened: null });
            }}
          >
            Back to my earlier work
          </button>{' '}
          <button type="button" data-testid="link-dismiss" onClick={() => session.setState({ linkOpened: null })}>
            Keep the link
          </button>
        </div>
      ) : null}
      {status.state === 'held' && status.newer ? (
        <div className="session-note warn" role="alert" data-testid="tab-conflict">
          Another tab saved newer work at {time(status.newer.savedAtMs)}. This tab&apos;s edits are not being saved until you choose:{' '}
          <button type="button" data-testid="conflict-load" onClick={() => void controller?.loadNewer()}>
            Load the other tab&apos;s work
          </button>{' '}
          <button type="button" data-testid="conflict-keep" onClick={() => controller?.keepMine()}>
            Keep this tab&apos;s (save over it)
          </button>
        </div>
      ) : null}
      {status.state === 'failed' && status.failure ? (
        <div className="session-note warn" role="alert" data-testid="save-status">
          {status.failure}
        </div>
      ) : null}
      {updateReady ? (
        <div className="session-note" role="status" data-testid="update-ready">
          A new version of Plumbline is ready.{' '}
          <button type="button" data-testid="update-reload" onClick={() => location.reload()}>
            Reload
          </button>
        </div>
      ) : null}
    </>
  );
}

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
    // A file keeps its own units (the display units are a view of it).
    const text = JSON.stringify(scenarioToFile(st.scenario), null, 2);
    const url = URL.createObjectURL(new Blob([text], { type: 'application/json' }));
    const a = document.createElement('a');
    a.href = url;
    a.download = `${st.scenario.name.replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '') || 'scenario'}.json`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };

  const [shareUrl, setShareUrl] = useState<string | null>(null);
  const share = async (): Promise<void> => {
    setShareUrl(null);
    const link = shareLink(`${location.origin}${location.pathname}`, store.getState().scenario);
    if (!link.ok) {
      setShareNote(link.message);
      return;
    }
    // The address bar is left alone: a link there would win over later edits at the next reload.
    try {
      await navigator.clipboard.writeText(link.url);
      setShareNote('Link copied.');
    } catch {
      setShareNote('Copy the link:');
      setShareUrl(link.url);
    }
  };

  return (
    <>
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
            // The size is checked before the file is read; the bytes carry their encoding.
            if (f) store.getState().importText(f.size > SCENARIO_LIMITS.fileBytes ? new Uint8Array(0) : new Uint8Array(await f.arrayBuffer()), f.size);
          }}
        />
      </label>
      <button type="button" data-testid="scenario-export" onClick={exportFile}>
        Save file
      </button>
      <button type="button" data-testid="share" onClick={() => void share()}>
        Share link
      </button>
      {shareNote ? (
        <span className="share-note" data-testid="share-note">
          {shareNote}
        </span>
      ) : null}
      {shareUrl ? <input className="share-url" data-testid="share-url" readOnly value={shareUrl} onFocus={(e) => e.target.select()} /> : null}
    </header>
    <SessionNotes />
    </>
  );
}
