import { LOAD_COLOUR_MAX_SHARE, loadColourStops } from '../present/palette';

export interface LoadLegendProps {
  /** Share of the static load at the top of the scale. */
  maxShare?: number;
}

/** The colour scale of the load columns: share of each tyre's static load, 0 to 200 %. */
export function LoadLegend({ maxShare = LOAD_COLOUR_MAX_SHARE }: LoadLegendProps) {
  const gradient = `linear-gradient(to right, ${loadColourStops(10).join(', ')})`;
  return (
    <div className="legend" data-testid="legend">
      <div className="legend-title">Tyre normal load, share of static</div>
      <div className="legend-bar" style={{ background: gradient }} />
      <div className="legend-ticks">
        <span>0 %</span>
        <span>{Math.round(maxShare * 50)} %</span>
        <span>{Math.round(maxShare * 100)} %</span>
      </div>
      <div className="legend-note">Colour: normal load over its load on level ground. Column height: scale reading. Hollow outlined tyre: lifted.</div>
    </div>
  );
}
