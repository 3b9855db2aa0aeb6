import { sceneHint, useInputKind } from '../store/inputKind';

/** The 3D view's hint, for the input in use (mouse, finger or pen). */
export function SceneHelp() {
  const kind = useInputKind();
  return (
    <div className="scene-help" data-testid="scene-help" data-input={kind}>
      {sceneHint(kind)}
    </div>
  );
}
