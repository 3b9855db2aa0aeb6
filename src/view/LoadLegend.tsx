import { VIRIDIS_STOPS } from './colormap';

export interface LoadLegendProps {
  /** Share of the static load at the top of the scale. */
  maxShare?: number;
}

/** The colour scale of the load columns: share of each tyre's static load, 0 to 200 %. */
export function LoadLegend({ maxShare = 2 }: LoadLegendProps) {
  const gradient = `linear-gradient(to right, ${VIRIDIS_STOPS.join(', ')})`;
  return (
    <div className="legend" data-testid="legend">
      <div className="legend-title">Tyre load, share of static</div>
      <div className="legend-bar" style={{ background: gradient }} />
      <div className="legend-ticks">
        <span>0 %</span>
        <span>{Math.round(maxShare * 50)} %</span>
        <span>{Math.round(maxShare * 100)} %</span>
      </div>
      <div className="legend-note">Column height: scale reading. Hollow outlined tyre: lifted.</div>
    </div>
  );
}
