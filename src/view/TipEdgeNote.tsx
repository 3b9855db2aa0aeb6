import { tipSentence, tipSideWords } from '../present/tipWords';
import { radToDeg } from '../present/units';
import { usePlumb } from '../store/react';
import { useSceneApi } from './sceneContext';
import { tipViewOf } from './tipState';

/**
 * For a pose that does not stand: a tag on the drawn tip edge ("tips about the left side"), placed
 * by <LabelProjector>, and one sentence over the view with the tip's tilt from level and how far
 * past it the pose is. Nothing while the pose stands.
 */
export function TipEdgeNote() {
  const api = useSceneApi();
  const tv = usePlumb(tipViewOf);
  if (!tv) {
    api.tipLabel = null;
    return null;
  }
  const sentence = tipSentence({
    edge: tv.tip.edge,
    downhillRad: tv.downhillRad,
    tipTiltRad: tv.tip.angleRad,
    tipFromLevelRad: tv.tip.fromLevelRad,
    poseTiltRad: tv.poseTiltRad,
  });
  return (
    <>
      <div className="scene-labels">
        <div
          ref={(el) => {
            api.tipLabel = el;
          }}
          className="tip-edge-tag"
          data-testid="tip-edge-tag"
          data-shown="true"
        >
          tips about {tipSideWords(tv.tip.edge)}
        </div>
      </div>
      <p className="tip-edge-note" role="status" data-testid="tip-edge" data-edge={tv.tip.edge.join(',')} data-tip-deg={String(radToDeg(tv.tip.angleRad))}>
        {sentence}{' '}
        <span className="tip-edge-more">The vehicle is drawn as it stands at the tip, in red; the magenta bar is the edge it goes over.</span>
      </p>
    </>
  );
}
