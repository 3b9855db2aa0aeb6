/**
 * App entry. Refuses to run inside another page's frame. Restores the newest autosave (localStorage
 * or IndexedDB), else the bundled demo; a share link opens as a new document beside that work (the
 * earlier work is kept in the garage and one Undo away, never overwritten), and the link leaves the
 * address bar once read. Then solve, render, autosave, and watch for a new version.
 */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario, scenarioToFile, type Scenario } from '../core';
import { browserGarage } from '../store/garage';
import { idbStore } from '../store/idb';
import { SAVE_CHANNEL, loadLatestAutosave, scenarioFromHash, startAutosave, type AutosaveOptions, type Restored } from '../store/persist';
import { session } from '../store/session';
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

/** Another page has put this app in a frame: say so and stop before any saved work is read. */
function refuseFramed(root: HTMLElement): void {
  const p = document.createElement('p');
  p.setAttribute('data-testid', 'framed-refusal');
  p.style.padding = '16px';
  p.textContent = 'Plumbline does not run inside another page\'s frame (it would let that page read your saved work). Open it in its own tab: ';
  const a = document.createElement('a');
  a.href = location.href;
  a.target = '_blank';
  a.rel = 'noopener noreferrer';
  a.textContent = location.href;
  p.append(a);
  root.replaceChildren(p);
}

function demoScenario(): Scenario {
  const parsed = parseScenario(demo);
  if (!parsed.ok) throw new Error(`app: the bundled demo scenario does not validate: ${parsed.errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`);
  return parsed.scenario;
}

const sameFile = (a: Scenario, b: Scenario): boolean => JSON.stringify(scenarioToFile(a)) === JSON.stringify(scenarioToFile(b));

async function start(root: HTMLElement): Promise<void> {
  const database = idbStore('autosave');
  let saved: Restored | null;
  try {
    saved = await loadLatestAutosave(localStorage, database);
  } catch {
    saved = null;
  }
  const hadLink = /^#s=/.test(location.hash);
  const fromLink = hadLink ? scenarioFromHash(location.hash) : null;
  // The link has been read: take it out of the address bar, so a reload opens the saved work, not the link again.
  if (hadLink) history.replaceState(history.state, '', location.pathname + location.search);

  const base = saved ?? { scenario: demoScenario(), units: demoScenario().units, rev: 0 };
  const store = createPlumbStore(base.scenario, base.units);
  let note: string | null = null;
  if (fromLink && !fromLink.ok) {
    note = saved ? 'The share link could not be read; your last work was restored.' : 'The share link could not be read; the bundled demo is open instead.';
  } else if (fromLink?.ok) {
    let keptAs: string | null = null;
    if (saved && !sameFile(saved.scenario, fromLink.scenario)) {
      // The earlier work goes to the garage before the link replaces it on screen (it also stays one Undo away).
      const garage = browserGarage();
      const name = `${saved.scenario.name} (kept when a link was opened)`;
      try {
        if (garage) {
          await garage.save(saved.scenario, saved.units, { name });
          keptAs = name;
        }
      } catch {
        keptAs = null;
      }
    }
    // An edit like any other: Undo steps back to the work that was open before the link.
    store.getState().replaceScenario(fromLink.scenario);
    store.getState().setUnits(fromLink.scenario.units);
    session.setState({ linkOpened: { name: fromLink.scenario.name, keptAs } });
  }
  if (note) store.setState({ importWarnings: [note] });

  const channel = typeof BroadcastChannel !== 'undefined' ? new BroadcastChannel(SAVE_CHANNEL) : null;
  const controller = startAutosave(store, localStorage, {
    database,
    rev: saved?.rev ?? 0,
    channel: channel as unknown as AutosaveOptions['channel'],
    onStorageEvent: (handler) => {
      const h = (e: StorageEvent) => handler(e.key);
      window.addEventListener('storage', h);
      return () => window.removeEventListener('storage', h);
    },
  });
  session.setState({ autosave: controller });
  // The opened link becomes the saved work at once (the earlier work is in the garage and the undo stack).
  if (fromLink?.ok) controller.saveNow();

  const handles: NonNullable<Window['__plumbline']> = { store, scene: null, startedMs: performance.now() };
  window.__plumbline = handles;
  createRoot(root).render(
    <StrictMode>
      <StoreProvider store={store}>
        <App onSceneApi={(api) => (handles.scene = api)} />
      </StoreProvider>
    </StrictMode>,
  );

  if ('serviceWorker' in navigator && import.meta.env.PROD) {
    // A new build's worker takes over (it skips waiting): the page on screen is the old build until reloaded.
    // The first worker taking over a page that had none (a first visit) is not a new version.
    let controlled = navigator.serviceWorker.controller !== null;
    navigator.serviceWorker.addEventListener('controllerchange', () => {
      if (controlled) session.setState({ updateReady: true });
      controlled = true;
    });
    // Look for a new build at start, whenever the app comes back into view, and every half hour.
    const register = () =>
      void navigator.serviceWorker
        .register('./sw.js', { updateViaCache: 'none' })
        .then((r) => {
          const check = () => void r.update().catch(() => undefined);
          document.addEventListener('visibilitychange', () => document.visibilityState === 'visible' && check());
          setInterval(check, 30 * 60 * 1000);
        })
        .catch(() => undefined);
    if (document.readyState === 'complete') register();
    else window.addEventListener('load', register);
  }
}

const root = document.getElementById('root');
if (!root) throw new Error('app: index.html has no #root element');
if (window.top !== window.self) refuseFramed(root);
else void start(root);
