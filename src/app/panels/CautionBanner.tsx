import { APP_CAUTION } from '../../present/words';

/** Always on screen: what the numbers are and are not. */
export function CautionBanner() {
  return (
    <div className="caution" role="note" data-testid="caution">
      <strong>Caution:</strong> {APP_CAUTION}
    </div>
  );
}
