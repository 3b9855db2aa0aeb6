import { useState } from 'react';
import { errorFor, getIn, validate, withField, type FieldSpec } from '../edit';
import { usePlumb, usePlumbStore } from '../../store/react';
import { NumberField } from './NumberField';

export interface SpecFieldProps {
  spec: FieldSpec;
  testId?: string;
}

/**
 * One numeric field of the scenario. A typed value that the scenario rules refuse is shown with
 * the rule's message at the field and not applied; the scenario keeps its last valid value.
 */
export function SpecField({ spec, testId }: SpecFieldProps) {
  const store = usePlumbStore();
  const units = usePlumb((s) => s.units);
  const value = usePlumb((s) => getIn(s.scenario, spec.si) as number);
  const [error, setError] = useState<string | null>(null);
  return (
    <NumberField
      label={spec.label}
      kind={spec.kind}
      units={units}
      valueSI={value}
      testId={testId ?? `field-${spec.file}`}
      error={error}
      onChange={(v) => {
        const cur = store.getState().scenario;
        const candidate = withField(cur, spec, v, units);
        const res = validate(candidate, units);
        if (res.ok) {
          setError(null);
          store.getState().editScenario(candidate, spec.file);
        } else {
          const own = errorFor(res.errors, spec.file);
          setError(own ?? `${res.errors[0].path}: ${res.errors[0].message}`);
        }
      }}
    />
  );
}
