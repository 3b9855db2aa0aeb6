import { Suspense, lazy, useEffect } from 'react';
import { Scene } from '../view/Scene';
import type { SceneApi } from '../view/sceneContext';
import { CautionBanner } from './panels/CautionBanner';
import { GaragePanel } from './panels/GaragePanel';
import { PanelBoundary } from './panels/PanelBoundary';
import { ImportErrors } from './panels/ImportErrors';
import { LoadsPanel } from './panels/LoadsPanel';
import { PosePanel } from './panels/PosePanel';
import { RosePanel } from './panels/RosePanel';
import { TerrainPanel } from './panels/TerrainPanel';
import { VehiclePanel } from './panels/VehiclePanel';
import { PathPanel } from './panels/PathPanel';
import { HeadingSweepPanel } from './panels/HeadingSweepPanel';
import { LimitCardPanel } from './panels/LimitCardPanel';
import { LiveTilt } from './panels/LiveTilt';
import { TiltPanel } from './panels/TiltPanel';
import { TopBar } from './panels/TopBar';
import { usePlumbStore } from '../store/react';

// Panels loaded after the first solved scene (their own chunks keep the first load small).
const loadPass = () => import('./panels/PassPanel');
const loadCompare = () => import('./panels/ComparePanel');
const loadCg = () => import('./panels/CgPanel');
const loadLines = () => import('./panels/LinesPanel');
const loadReport = () => import('./panels/ReportPanel');
const PassPanel = lazy(() => loadPass().then((m) => ({ default: m.PassPanel })));
const ComparePanel = lazy(() => loadCompare().then((m) => ({ default: m.ComparePanel })));
const CgPanel = lazy(() => loadCg().then((m) => ({ default: m.CgPanel })));
const LinesPanel = lazy(() => loadLines().then((m) => ({ default: m.LinesPanel })));
const ReportPanel = lazy(() => loadReport().then((m) => ({ default: m.ReportPanel })));

/** Fetches every lazy panel once the app is idle, so the offline cache holds them all. */
export function preloadPanels(): Promise<unknown> {
  return Promise.all([loadPass(), loadCompare(), loadCg(), loadLines(), loadReport()]);
}

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
    const idle = setTimeout(() => void preloadPanels().catch(() => undefined), 1500);
    return () => {
      clearTimeout(idle);
      window.removeEventListener('keydown', onKey);
    };
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
          <PanelBoundary name="obstacle pass">
            <Suspense fallback={<p className="panel hint">Loading the obstacle pass…</p>}>
              <PassPanel />
            </Suspense>
          </PanelBoundary>
          <PathPanel />
          <RosePanel />
          <HeadingSweepPanel />
          <PanelBoundary name="compare builds">
            <Suspense fallback={null}>
              <ComparePanel />
            </Suspense>
          </PanelBoundary>
          <PanelBoundary name="best line">
            <Suspense fallback={null}>
              <LinesPanel />
            </Suspense>
          </PanelBoundary>
          <PosePanel />
          <VehiclePanel />
          <PanelBoundary name="measure the CG">
            <Suspense fallback={null}>
              <CgPanel />
            </Suspense>
          </PanelBoundary>
          <TerrainPanel />
          <LimitCardPanel />
          <LiveTilt />
          <PanelBoundary name="report">
            <Suspense fallback={null}>
              <ReportPanel />
            </Suspense>
          </PanelBoundary>
          <PanelBoundary name="garage">
            <GaragePanel />
          </PanelBoundary>
        </aside>
      </main>
    </div>
  );
}
