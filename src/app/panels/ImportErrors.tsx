import { usePlumb, usePlumbStore } from '../../store/react';

/** Why the last file could not be opened; the scenario on screen was kept. */
export function ImportErrors() {
  const store = usePlumbStore();
  const errors = usePlumb((s) => s.importErrors);
  const warnings = usePlumb((s) => s.importWarnings);
  if (!errors && warnings.length === 0) return null;
  return (
    <div className={errors ? 'import-errors' : 'import-warnings'} role="alert">
      {errors ? (
        <>
          <strong>The file was not opened; your current scenario is unchanged.</strong>
          <ul data-testid="error-list">
            {errors.map((e, i) => (
              <li key={i}>
                <code>{e.path || '(file)'}</code>: {e.message}
              </li>
            ))}
          </ul>
          <button type="button" onClick={() => store.getState().clearImportErrors()}>
            Dismiss
          </button>
        </>
      ) : (
        <ul data-testid="import-warnings">
          {warnings.map((w, i) => (
            <li key={i}>{w}</li>
          ))}
        </ul>
      )}
    </div>
  );
}
