import { useEffect } from 'react';
import { Scene } from '../view/Scene';
import type { SceneApi } from '../view/sceneContext';
import { CautionBanner } from './panels/CautionBanner';
import { ImportErrors } from './panels/ImportErrors';
import { LoadsPanel } from './panels/LoadsPanel';
import { PosePanel } from './panels/PosePanel';
import { RosePanel } from './panels/RosePanel';
import { TerrainPanel } from './panels/TerrainPanel';
import { VehiclePanel } from './panels/VehiclePanel';
import { TiltPanel } from './panels/TiltPanel';
import { TopBar } from './panels/TopBar';
import { usePlumbStore } from './storeContext';

export interface AppProps {
  onSceneApi?: (api: SceneApi) => void;
}

/** Layout: top bar, caution, the scene on the left and the panels on the right. */
export function App({ onSceneApi }: AppProps) {
  const store = usePlumbStore();
  useEffect(() => {
    const onKey = (e: KeyboardEvent): void => {
      const t = e.target as HTMLElement | null;
      if (t && (t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT')) return;
      if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === 'z') {
        e.preventDefault();
        if (e.shiftKey) store.getState().redo();
        else store.getState().undo();
      } else if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === 'y') {
        e.preventDefault();
        store.getState().redo();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [store]);
  return (
    <div className="app">
      <TopBar />
      <CautionBanner />
      <ImportErrors />
      <main className="main">
        <Scene onApi={onSceneApi} />
        <aside className="side">
          <LoadsPanel />
          <TiltPanel />
          <RosePanel />
          <PosePanel />
          <VehiclePanel />
          <TerrainPanel />
        </aside>
      </main>
    </div>
  );
}
