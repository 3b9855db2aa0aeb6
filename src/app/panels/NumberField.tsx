import { useState } from 'react';
import { useEditedText } from './useEditedText';
import type { QuantityKind, UnitSystem } from '../../core';
import { fieldUnit, fieldValue } from '../../present/fields';
import { toSI } from '../../core';

export interface NumberFieldProps {
  label: string;
  /** Value in SI (m, kg, rad, N/m …). */
  valueSI: number;
  kind: QuantityKind;
  units: UnitSystem;
  /** Called with the new SI value on every valid keystroke. */
  onChange: (valueSI: number) => void;
  testId?: string;
  step?: number;
  /** Message shown at the field (from validation). */
  error?: string | null;
  /** Extra check on the typed number, in display units; return a message to refuse it. */
  check?: (displayValue: number) => string | null;
}

/**
 * A number in display units over an SI value. The typed text is kept while the field has focus,
 * so the stored value is whatever was typed, converted once, never a rounded display value.
 */
export function NumberField({ label, valueSI, kind, units, onChange, testId, step, error = null, check }: NumberFieldProps) {
  const shown = fieldValue(kind, valueSI, units);
  const [local, setLocal] = useState<string | null>(null);
  const { text, setText, onFocus, onBlur } = useEditedText(shown, () => setLocal(null));
  const unit = fieldUnit(kind, units);
  const message = local ?? error;
  return (
    <label className={message ? 'field invalid' : 'field'}>
      <span className="field-label">{label}</span>
      <span className="field-input">
        <input
          type="number"
          inputMode="decimal"
          step={step ?? 'any'}
          value={text}
          data-testid={testId}
          aria-invalid={message ? true : undefined}
          onFocus={onFocus}
          onBlur={onBlur}
          onChange={(e) => {
            const t = e.target.value;
            setText(t);
            const v = Number(t);
            if (t.trim() === '' || !Number.isFinite(v)) {
              setLocal('enter a number');
              return;
            }
            const c = check?.(v) ?? null;
            setLocal(c);
            if (c === null) onChange(toSI(kind, v, units));
          }}
        />
        {unit ? <span className="unit">{unit}</span> : null}
      </span>
      {message ? (
        <span className="field-error" role="alert">
          {message}
        </span>
      ) : null}
    </label>
  );
}
