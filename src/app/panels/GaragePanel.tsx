import { useCallback, useEffect, useState } from 'react';
import { browserGarage, type GarageItem } from '../../store/garage';
import { usePlumbStore } from '../../store/react';

/**
 * The garage: vehicles and scenarios kept in this browser, each with a name, a customer or unit
 * number and the date saved. Open (an undoable edit), duplicate, rename, delete, export all, import.
 */
export function GaragePanel() {
  const store = usePlumbStore();
  const garage = browserGarage();
  const [items, setItems] = useState<GarageItem[]>([]);
  const [name, setName] = useState('');
  const [customer, setCustomer] = useState('');
  const [note, setNote] = useState<string | null>(null);
  const [renaming, setRenaming] = useState<{ id: string; name: string; customer: string } | null>(null);

  const refresh = useCallback(async () => {
    if (garage) setItems(await garage.list());
  }, [garage]);
  useEffect(() => {
    void refresh();
    return garage?.subscribe(() => void refresh());
  }, [garage, refresh]);

  if (!garage) {
    return (
      <section className="panel" aria-label="Garage">
        <h2>Garage</h2>
        <p className="hint">This browser keeps no local database (IndexedDB), so the garage is not available here. Use “Save file”.</p>
      </section>
    );
  }

  const act = async (what: () => Promise<unknown>, done: string): Promise<void> => {
    try {
      await what();
      setNote(done);
    } catch (e) {
      setNote(`Not done: ${(e as Error).message}`);
    }
  };

  const save = () => {
    const st = store.getState();
    void act(() => garage.save(st.scenario, st.units, { name: name || st.scenario.name, customer }), `Saved “${name || st.scenario.name}” to the garage.`).then(() => {
      setName('');
      setCustomer('');
    });
  };

  const open = (id: string) =>
    void act(async () => {
      const item = await garage.open(id);
      if (!item || !item.ok) throw new Error(item ? item.problem : 'the entry is gone');
      // An edit like any other: Undo goes back to the scenario that was open.
      store.getState().replaceScenario(item.scenario);
      store.getState().setUnits(item.entry.units);
    }, 'Opened from the garage (Undo goes back).');

  const exportAll = () =>
    void act(async () => {
      const r = await garage.exportAll();
      const url = URL.createObjectURL(new Blob([r.text], { type: 'application/json' }));
      const a = document.createElement('a');
      a.href = url;
      a.download = `plumbline-garage-${new Date().toISOString().slice(0, 10)}.json`;
      a.click();
      setTimeout(() => URL.revokeObjectURL(url), 1000);
      if (r.skipped > 0) throw new Error(`${r.exported} exported; ${r.skipped} damaged entr${r.skipped === 1 ? 'y' : 'ies'} left out`);
    }, 'Garage exported.');

  const importFile = async (f: File) => {
    const r = await garage.importText(await f.text());
    setNote(`Imported ${r.added} entr${r.added === 1 ? 'y' : 'ies'}.${r.refused.length ? ` Not imported: ${r.refused.join('; ')}` : ''}`);
  };

  const date = (ms: number) => new Date(ms).toLocaleString([], { dateStyle: 'medium', timeStyle: 'short' });

  return (
    <section className="panel" aria-label="Garage">
      <h2>Garage</h2>
      <div className="row">
        <input aria-label="Name" placeholder="Name (default: the scenario's)" value={name} onChange={(e) => setName(e.target.value)} data-testid="garage-name" />
        <input aria-label="Customer or unit number" placeholder="Customer or unit number" value={customer} onChange={(e) => setCustomer(e.target.value)} data-testid="garage-customer" />
        <button type="button" data-testid="garage-save" onClick={save}>
          Save current to garage
        </button>
      </div>
      <ul className="garage-list" data-testid="garage-list">
        {items.length === 0 ? <li className="hint">Nothing saved yet.</li> : null}
        {items.map((it) =>
          it.ok ? (
            <li key={it.entry.id} data-testid="garage-item" data-id={it.entry.id}>
              {renaming?.id === it.entry.id ? (
                <>
                  <input aria-label="New name" value={renaming.name} onChange={(e) => setRenaming({ ...renaming, name: e.target.value })} data-testid="garage-rename-name" />
                  <input aria-label="New customer or unit number" value={renaming.customer} onChange={(e) => setRenaming({ ...renaming, customer: e.target.value })} />
                  <button type="button" data-testid="garage-rename-ok" onClick={() => void act(() => garage.rename(renaming.id, renaming.name, renaming.customer), 'Renamed.').then(() => setRenaming(null))}>
                    OK
                  </button>
                  <button type="button" onClick={() => setRenaming(null)}>
                    Cancel
                  </button>
                </>
              ) : (
                <>
                  <strong data-testid="garage-item-name">{it.entry.name}</strong>
                  {it.entry.customer ? <span data-testid="garage-item-customer"> · {it.entry.customer}</span> : null}
                  <span className="hint"> · {date(it.entry.savedAtMs)}</span>{' '}
                  <button type="button" data-testid="garage-open" onClick={() => open(it.entry.id)}>
                    Open
                  </button>
                  <button type="button" data-testid="garage-duplicate" onClick={() => void act(() => garage.duplicate(it.entry.id), 'Duplicated.')}>
                    Duplicate
                  </button>
                  <button type="button" data-testid="garage-rename" onClick={() => setRenaming({ id: it.entry.id, name: it.entry.name, customer: it.entry.customer })}>
                    Rename
                  </button>
                  <button
                    type="button"
                    data-testid="garage-delete"
                    onClick={() => {
                      if (confirm(`Delete “${it.entry.name}” from the garage?`)) void act(() => garage.remove(it.entry.id), 'Deleted.');
                    }}
                  >
                    Delete
                  </button>
                </>
              )}
            </li>
          ) : (
            <li key={it.id} data-testid="garage-item" data-damaged="true">
              <strong>{it.name}</strong> <span className="warn">damaged: {it.problem}</span>{' '}
              <button type="button" data-testid="garage-delete" onClick={() => void act(() => garage.remove(it.id), 'Deleted.')}>
                Delete
              </button>
            </li>
          ),
        )}
      </ul>
      <div className="row">
        <button type="button" data-testid="garage-export" onClick={exportAll}>
          Export all
        </button>
        <label className="file-button">
          Import…
          <input
            type="file"
            accept=".json,application/json"
            data-testid="garage-import"
            onChange={(e) => {
              const f = e.target.files?.[0];
              e.target.value = '';
              if (f) void importFile(f);
            }}
          />
        </label>
      </div>
      {note ? (
        <p className="hint" data-testid="garage-note">
          {note}
        </p>
      ) : null}
    </section>
  );
}
