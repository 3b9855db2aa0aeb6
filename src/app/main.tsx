/** App entry: pick the scenario (share link, then autosave, then the bundled demo), solve, render. */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario, type Scenario, type UnitSystem } from '../core';
import { autosave, loadAutosave, scenarioFromHash } from '../store/persist';
import { createPlumbStore, type PlumbStore } from '../store/store';
import type { SceneApi } from '../view/sceneContext';
import { App } from './App';
import { StoreProvider } from '../store/react';
import './styles.css';

declare global {
  interface Window {
    /** Handles for the end-to-end tests and the benchmark script. */
    __plumbline?: { store: PlumbStore; scene: SceneApi | null; startedMs: number };
  }
}

function initial(): { scenario: Scenario; units: UnitSystem; note: string | null } {
  const fromLink = scenarioFromHash(location.hash);
  if (fromLink?.ok) return { scenario: fromLink.scenario, units: fromLink.scenario.units, note: null };
  const saved = loadAutosave(localStorage);
  if (saved) return { ...saved, note: fromLink && !fromLink.ok ? 'The share link could not be read; your last work was restored.' : null };
  const parsed = parseScenario(demo);
  if (!parsed.ok) throw new Error(`app: the bundled demo scenario does not validate: ${parsed.errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`);
  return {
    scenario: parsed.scenario,
    units: parsed.scenario.units,
    note: fromLink && !fromLink.ok ? 'The share link could not be read; the bundled demo is open instead.' : null,
  };
}

const start = initial();
const store = createPlumbStore(start.scenario, start.units);
if (start.note) store.setState({ importWarnings: [start.note] });
autosave(store, localStorage);
const handles: NonNullable<Window['__plumbline']> = { store, scene: null, startedMs: performance.now() };
window.__plumbline = handles;

const root = document.getElementById('root');
if (!root) throw new Error('app: index.html has no #root element');
createRoot(root).render(
  <StrictMode>
    <StoreProvider store={store}>
      <App onSceneApi={(api) => (handles.scene = api)} />
    </StoreProvider>
  </StrictMode>,
);

if ('serviceWorker' in navigator && import.meta.env.PROD) {
  window.addEventListener('load', () => {
    navigator.serviceWorker.register('./sw.js').catch(() => undefined);
  });
}
