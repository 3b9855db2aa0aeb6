import { useState } from 'react';
import { useEditedText } from './useEditedText';
import {
  M_PER_IN,
  applyBuild,
  backspacingFromOffsetM,
  fromSI,
  offsetFromBackspacingM,
  toSI,
  unitLabel,
  type BuildSpec,
  type PayloadItem,
  type QuantityKind,
  type Scenario,
  type ScenarioError,
  type UnitSystem,
  type Vehicle,
} from '../../core';
import { MAX_FORM_BUILDS, addBuild, buildFilePath, moveBuild, removeBuild, replaceBuild, setBuildValue, validateBuilds } from '../buildEdit';
import { errorFor, getIn, type Key } from '../edit';
import { usePlumb, usePlumbStore } from '../../store/react';
import { buildChangesWords } from '../../present/words';

/** How a value is shown: SI → display number, back, and the unit. */
interface Display {
  readonly to: (si: number) => number;
  readonly from: (shown: number) => number;
  readonly unit: string;
}
const inUnits = (kind: QuantityKind, units: UnitSystem): Display => ({ to: (v) => fromSI(kind, v, units), from: (v) => toSI(kind, v, units), unit: unitLabel(kind, units) });
/** Wheel fitment stays in the trade's units in both unit systems (as the scenario file writes it). */
const INCH: Display = { to: (v) => v / M_PER_IN, from: (v) => v * M_PER_IN, unit: 'in' };
const MM: Display = { to: (v) => v * 1000, from: (v) => v / 1000, unit: 'mm' };

const shownText = (d: Display, si: number | undefined): string => (si === undefined ? '' : String(Number(d.to(si).toPrecision(7))));

/**
 * Commits one value of a build; returns the message for the field when the scenario rules refuse
 * it. Typed values of one field merge into one undo step; `ownStep` (a choice, a box, a button) is
 * always its own step.
 */
type Commit = (path: readonly Key[], valueSI: unknown, fileRest: string, ownStep?: boolean) => string | null;

interface BuildFieldProps {
  label: string;
  testId: string;
  valueSI: number | undefined;
  display: Display;
  /** Empty means "not changed by this build" (removes the value). */
  optional: boolean;
  placeholder?: string;
  disabled?: boolean;
  onValue: (valueSI: number | undefined) => string | null;
}

/** A number of a build in its display unit; the typed text is kept while the field has focus (no rounding written back). */
function BuildField({ label, testId, valueSI, display, optional, placeholder, disabled, onValue }: BuildFieldProps) {
  const shown = shownText(display, valueSI);
  const [message, setMessage] = useState<string | null>(null);
  const { text, setText, onFocus, onBlur } = useEditedText(shown, () => setMessage(null));
  return (
    <label className={message ? 'field invalid' : 'field'}>
      <span className="field-label">{label}</span>
      <span className="field-input">
        <input
          type="number"
          inputMode="decimal"
          step="any"
          value={text}
          placeholder={placeholder}
          disabled={disabled}
          data-testid={testId}
          aria-invalid={message ? true : undefined}
          onFocus={onFocus}
          onBlur={onBlur}
          onChange={(e) => {
            const t = e.target.value;
            setText(t);
            if (t.trim() === '') {
              setMessage(optional ? onValue(undefined) : 'enter a number');
              return;
            }
            const v = Number(t);
            if (!Number.isFinite(v)) {
              setMessage('enter a number');
              return;
            }
            setMessage(onValue(display.from(v)));
          }}
        />
        <span className="unit">{display.unit}</span>
      </span>
      {message ? (
        <span className="field-error" role="alert">
          {message}
        </span>
      ) : null}
    </label>
  );
}

function TextField({ label, testId, value, onValue }: { label: string; testId: string; value: string; onValue: (v: string) => string | null }) {
  const [message, setMessage] = useState<string | null>(null);
  const { text, setText, onFocus, onBlur } = useEditedText(value, () => setMessage(null));
  return (
    <label className={message ? 'field invalid' : 'field'}>
      <span className="field-label">{label}</span>
      <input
        type="text"
        value={text}
        data-testid={testId}
        aria-invalid={message ? true : undefined}
        onFocus={onFocus}
        onBlur={onBlur}
        onChange={(e) => {
          setText(e.target.value);
          setMessage(onValue(e.target.value));
        }}
      />
      {message ? (
        <span className="field-error" role="alert">
          {message}
        </span>
      ) : null}
    </label>
  );
}

/** A build holds only what it changes: wheels with neither new wheels nor a spacer are no change. */
function tidy(b: BuildSpec): BuildSpec {
  if (b.wheels && !b.wheels.fitted && !b.wheels.spacerM) {
    const { wheels: _dropped, ...rest } = b;
    return rest;
  }
  return b;
}

/** The message for a file path among the errors: its own, else the first one of this build, else the first. */
function messageFor(errors: readonly ScenarioError[], index: number, fileRest: string): string {
  const own = errorFor(errors, buildFilePath(index, fileRest));
  if (own) return own;
  const prefix = buildFilePath(index, '');
  const e = errors.find((x) => x.path.startsWith(prefix + '.') || x.path === prefix) ?? errors[0];
  return `${e.path}: ${e.message}`;
}

const DEFAULT_RIM_M = 8 * M_PER_IN;
const DEFAULT_OFFSET_M = 0.025;

function WheelFitmentFields({ i, b, commit, which }: { i: number; b: BuildSpec; commit: Commit; which: 'fitted' | 'stock' }) {
  const f = b.wheels?.[which];
  if (!f) return null;
  const file = which === 'fitted' ? 'wheels' : 'wheels.stock';
  const by = f.backspacingM !== undefined ? 'backspacing' : 'offset';
  const tid = `build-${i}-${which === 'fitted' ? 'wheel' : 'stock'}`;
  const base: Key[] = ['wheels', which];
  return (
    <div className="row">
      <BuildField
        label={which === 'fitted' ? 'New rim width' : 'Stock rim width'}
        testId={`${tid}-rim`}
        valueSI={f.rimWidthM}
        display={INCH}
        optional={false}
        onValue={(v) => commit([...base, 'rimWidthM'], v, `${file}.rimWidth`)}
      />
      <label className="field">
        <span className="field-label">Given as</span>
        <select
          value={by}
          data-testid={`${tid}-by`}
          onChange={(e) => {
            // Switching keeps the same wheel: the value is converted by the rule (rim + 1 in)/2 + offset.
            const next =
              e.target.value === 'backspacing'
                ? { rimWidthM: f.rimWidthM, backspacingM: backspacingFromOffsetM(f.rimWidthM, f.offsetM ?? 0) }
                : { rimWidthM: f.rimWidthM, offsetM: offsetFromBackspacingM(f.rimWidthM, f.backspacingM ?? 0) };
            commit(base, next, file, true);
          }}
        >
          <option value="offset">offset (mm)</option>
          <option value="backspacing">backspacing (in)</option>
        </select>
      </label>
      {by === 'offset' ? (
        <BuildField
          label={which === 'fitted' ? 'New offset' : 'Stock offset'}
          testId={`${tid}-offset`}
          valueSI={f.offsetM}
          display={MM}
          optional={false}
          onValue={(v) => commit([...base, 'offsetM'], v, `${file}.offset`)}
        />
      ) : (
        <BuildField
          label={which === 'fitted' ? 'New backspacing' : 'Stock backspacing'}
          testId={`${tid}-backspacing`}
          valueSI={f.backspacingM}
          display={INCH}
          optional={false}
          onValue={(v) => commit([...base, 'backspacingM'], v, `${file}.backspacing`)}
        />
      )}
    </div>
  );
}

function AntiRollField({ i, b, v, end, units, commit }: { i: number; b: BuildSpec; v: Vehicle; end: 'front' | 'rear'; units: UnitSystem; commit: Commit }) {
  const x = b.antiRoll?.[end];
  const mode = x === undefined ? 'kept' : x === 'disconnected' ? 'disconnected' : 'new';
  const current = (end === 'front' ? v.suspensionFront : v.suspensionRear).antiRollNmPerRad;
  const [message, setMessage] = useState<string | null>(null);
  return (
    <div className="row">
      <label className="field">
        <span className="field-label">{end === 'front' ? 'Front' : 'Rear'} anti-roll bar</span>
        <select
          value={mode}
          data-testid={`build-${i}-antiroll-${end}`}
          onChange={(e) => {
            const m = e.target.value;
            setMessage(commit(['antiRoll', end], m === 'kept' ? undefined : m === 'disconnected' ? 'disconnected' : current, `antiRoll.${end}`, true));
          }}
        >
          <option value="kept">as the vehicle</option>
          <option value="disconnected">disconnected</option>
          <option value="new">new stiffness</option>
        </select>
        {message ? <span className="field-error">{message}</span> : null}
      </label>
      {mode === 'new' ? (
        <BuildField
          label="Stiffness"
          testId={`build-${i}-antiroll-${end}-stiffness`}
          valueSI={x as number}
          display={inUnits('rollStiffness', units)}
          optional={false}
          onValue={(n) => commit(['antiRoll', end], n, `antiRoll.${end}`)}
        />
      ) : null}
    </div>
  );
}

function PayloadFields({ i, b, v, units, commit }: { i: number; b: BuildSpec; v: Vehicle; units: UnitSystem; commit: Commit }) {
  const items = b.payload ?? [];
  const len = inUnits('length', units);
  const set = (next: readonly PayloadItem[]) => commit(['payload'], next.length === 0 ? undefined : next, 'payload', true);
  return (
    <fieldset className="group">
      <legend>Payload added (heights as fitted on this build)</legend>
      {items.map((p, j) => {
        const fld = (label: string, key: keyof PayloadItem, file: string, d: Display) => (
          <BuildField
            label={label}
            testId={`build-${i}-payload-${j}-${file}`}
            valueSI={p[key] as number}
            display={d}
            optional={false}
            onValue={(n) => commit(['payload', j, key], n, `payload[${j}].${file}`)}
          />
        );
        return (
          <div key={j} className="payload-item">
            <div className="row">
              <TextField label="Item" testId={`build-${i}-payload-${j}-label`} value={p.label} onValue={(t) => commit(['payload', j, 'label'], t, `payload[${j}].label`)} />
              <button type="button" aria-label={`Remove ${p.label} from the build`} onClick={() => set(items.filter((_, k) => k !== j))}>
                Remove
              </button>
            </div>
            <div className="grid2">
              {fld('Mass', 'massKg', 'mass', inUnits('mass', units))}
              {fld('Behind front axle', 'behindFrontAxleM', 'behindFrontAxle', len)}
              {fld('Height', 'heightM', 'height', len)}
              {fld('Left of centre', 'leftOfCentreM', 'leftOfCentre', len)}
            </div>
          </div>
        );
      })}
      <button
        type="button"
        data-testid={`build-${i}-payload-add`}
        onClick={() => set([...items, { label: 'roof load', massKg: 60, behindFrontAxleM: v.wheelbaseM / 2, heightM: v.body.roofHeightM + 0.15, leftOfCentreM: 0 }])}
      >
        Add payload item
      </button>
    </fieldset>
  );
}

/** Every modification the builds block holds, for build i. */
function BuildFields({ i, b, v, units, commit }: { i: number; b: BuildSpec; v: Vehicle; units: UnitSystem; commit: Commit }) {
  const len = inUnits('length', units);
  const num = (label: string, path: readonly Key[], file: string, d: Display, placeholder?: string, disabled?: boolean) => (
    <BuildField
      label={label}
      testId={`build-${i}-${file.replace(/\./g, '-')}`}
      valueSI={getIn(b, path) as number | undefined}
      display={d}
      optional
      placeholder={placeholder}
      disabled={disabled}
      onValue={(n) => commit(path, n, file)}
    />
  );
  const asVehicle = (si: number, d: Display) => `as now: ${shownText(d, si)}`;
  const hasTyre = b.tyre !== undefined;
  const w = b.wheels;
  const hasWheels = w !== undefined;
  return (
    <div className="build-fields">
      <p className="fineprint">Leave a field empty for no change. Lengths in {len.unit}, masses in {unitLabel('mass', units)}; wheel fitment in the trade's units whatever the unit system: rim width and backspacing in inches, offset in millimetres (as the scenario file writes them).</p>
      <fieldset className="group">
        <legend>Lift</legend>
        <div className="grid2">
          {num('Suspension lift', ['lift', 'suspensionM'], 'lift.suspension', len)}
          {num('Body lift', ['lift', 'bodyM'], 'lift.body', len)}
          {num('Body share of sprung mass', ['lift', 'bodyMassShare'], 'lift.bodyMassShare', inUnits('ratio', units), 'estimate 0.35', b.lift?.bodyM === undefined)}
        </div>
      </fieldset>
      <fieldset className="group">
        <legend>Tyres (both axles)</legend>
        <div className="grid2">
          <BuildField
            label="Radius, unloaded"
            testId={`build-${i}-tyre-radius`}
            valueSI={b.tyre?.radiusM}
            display={len}
            optional
            placeholder={asVehicle(v.tyreFront.radiusM, len)}
            onValue={(n) => commit(['tyre'], n === undefined ? undefined : { ...b.tyre, radiusM: n }, 'tyre.radius')}
          />
          {num('Width', ['tyre', 'widthM'], 'tyre.width', len, asVehicle(v.tyreFront.widthM, len), !hasTyre)}
          {num('Radial stiffness', ['tyre', 'stiffnessNPerM'], 'tyre.stiffness', inUnits('stiffness', units), asVehicle(v.tyreFront.stiffnessNPerM, inUnits('stiffness', units)), !hasTyre)}
        </div>
        {!hasTyre ? <p className="fineprint">Give a radius for new tyres; width and stiffness follow it.</p> : null}
      </fieldset>
      <fieldset className="group">
        <legend>Wheels and spacers</legend>
        <div className="row">
          {num('Spacer per side', ['wheels', 'spacerM'], 'wheels.spacer', len)}
          <label className="field">
            <span className="field-label">On</span>
            <select value={w?.axle ?? 'both'} disabled={!hasWheels} data-testid={`build-${i}-wheels-axle`} onChange={(e) => commit(['wheels', 'axle'], e.target.value, 'wheels.axle', true)}>
              <option value="both">both axles</option>
              <option value="front">front axle</option>
              <option value="rear">rear axle</option>
            </select>
          </label>
        </div>
        <label className="inline">
          <input
            type="checkbox"
            checked={w?.fitted !== undefined}
            data-testid={`build-${i}-wheels-new`}
            onChange={(e) =>
              commit(
                ['wheels'],
                e.target.checked
                  ? { ...w, axle: w?.axle ?? 'both', fitted: { rimWidthM: DEFAULT_RIM_M, offsetM: DEFAULT_OFFSET_M }, stock: w?.stock ?? { rimWidthM: DEFAULT_RIM_M, offsetM: DEFAULT_OFFSET_M } }
                  : w && { axle: w.axle ?? 'both', ...(w.spacerM ? { spacerM: w.spacerM } : {}) },
                'wheels',
                true,
              )
            }
          />
          New wheels (a different offset moves the tyres out or in)
        </label>
        {w?.fitted ? (
          <>
            <WheelFitmentFields i={i} b={b} commit={commit} which="fitted" />
            <p className="fineprint">The wheels the vehicle's track was measured on:</p>
            <WheelFitmentFields i={i} b={b} commit={commit} which="stock" />
          </>
        ) : null}
      </fieldset>
      <fieldset className="group">
        <legend>Anti-roll bars</legend>
        <AntiRollField i={i} b={b} v={v} end="front" units={units} commit={commit} />
        <AntiRollField i={i} b={b} v={v} end="rear" units={units} commit={commit} />
      </fieldset>
      <fieldset className="group">
        <legend>Travel from ride height (longer shocks, bump stops)</legend>
        <div className="grid2">
          {num('Front bump', ['travel', 'front', 'bumpM'], 'travel.front.bump', len, asVehicle(v.suspensionFront.bumpM, len))}
          {num('Front droop', ['travel', 'front', 'droopM'], 'travel.front.droop', len, asVehicle(v.suspensionFront.droopM, len))}
          {num('Rear bump', ['travel', 'rear', 'bumpM'], 'travel.rear.bump', len, asVehicle(v.suspensionRear.bumpM, len))}
          {num('Rear droop', ['travel', 'rear', 'droopM'], 'travel.rear.droop', len, asVehicle(v.suspensionRear.droopM, len))}
        </div>
      </fieldset>
      <PayloadFields i={i} b={b} v={v} units={units} commit={commit} />
    </div>
  );
}

/**
 * The scenario's build options: add, edit, remove and reorder. Each change is checked against the
 * scenario rules (the message shows at the field and nothing is applied when refused) and is one
 * undo step (keystrokes in one field merge, as in the other forms).
 */
export function BuildsForm() {
  const store = usePlumbStore();
  const builds = usePlumb((s) => s.scenario.builds) ?? [];
  const vehicle = usePlumb((s) => s.scenario.vehicle);
  const units = usePlumb((s) => s.units);
  const [open, setOpen] = useState<number | null>(null);
  const [message, setMessage] = useState<string | null>(null);

  /** A change of the list itself (add, remove, move): one undo step. */
  const replace = (next: Scenario): boolean => {
    const res = validateBuilds(next, units);
    if (!res.ok) {
      setMessage(`${res.errors[0].path}: ${res.errors[0].message}`);
      return false;
    }
    setMessage(null);
    store.getState().replaceScenario(next);
    return true;
  };
  const commitFor =
    (i: number): Commit =>
    (path, value, fileRest, ownStep = false) => {
      const cur = store.getState().scenario;
      const b = cur.builds?.[i];
      if (!b) return 'this build is gone (undone?)';
      const cand = replaceBuild(cur, i, tidy(setBuildValue(b, path, value)));
      const res = validateBuilds(cand, units);
      if (!res.ok) return messageFor(res.errors, i, fileRest);
      if (ownStep) store.getState().replaceScenario(cand);
      else store.getState().editScenario(cand, buildFilePath(i, fileRest));
      return null;
    };

  return (
    <fieldset className="group builds-form" data-testid="builds-form">
      <legend>Build options</legend>
      {builds.length === 0 ? <p className="hint">No builds yet: add one, then give what it changes (lift, tyres, wheels and spacers, payload, anti-roll bars, travel).</p> : null}
      <ol className="builds">
        {builds.map((b, i) => {
          const isOpen = open === i;
          return (
            <li key={i} className="build-item" data-testid={`build-${i}`}>
              <div className="row build-head">
                <TextField label={`Build [${i + 2}] name`} testId={`build-${i}-name`} value={b.name} onValue={(t) => commitFor(i)(['name'], t, 'name')} />
                <div className="buttons">
                  <button type="button" data-testid={`build-${i}-edit`} aria-expanded={isOpen} onClick={() => setOpen(isOpen ? null : i)}>
                    {isOpen ? 'Done' : 'Edit'}
                  </button>
                  <button type="button" data-testid={`build-${i}-up`} disabled={i === 0} aria-label={`Move ${b.name} up`} onClick={() => replace(moveBuild(store.getState().scenario, i, -1)) && setOpen(isOpen ? i - 1 : open === i - 1 ? i : open)}>
                    ↑
                  </button>
                  <button type="button" data-testid={`build-${i}-down`} disabled={i === builds.length - 1} aria-label={`Move ${b.name} down`} onClick={() => replace(moveBuild(store.getState().scenario, i, 1)) && setOpen(isOpen ? i + 1 : open === i + 1 ? i : open)}>
                    ↓
                  </button>
                  <button type="button" data-testid={`build-${i}-remove`} aria-label={`Remove ${b.name}`} onClick={() => replace(removeBuild(store.getState().scenario, i)) && setOpen(open === null || open < i ? open : open === i ? null : open - 1)}>
                    Remove
                  </button>
                </div>
              </div>
              {isOpen ? <BuildFields i={i} b={b} v={vehicle} units={units} commit={commitFor(i)} /> : <p className="fineprint">{buildChangesWords(applyBuild(vehicle, b).changes, units)}</p>}
            </li>
          );
        })}
      </ol>
      <div className="buttons">
        <button
          type="button"
          data-testid="build-add"
          disabled={builds.length >= MAX_FORM_BUILDS}
          onClick={() => {
            if (replace(addBuild(store.getState().scenario))) setOpen(builds.length);
          }}
        >
          Add a build
        </button>
      </div>
      {builds.length >= MAX_FORM_BUILDS ? <p className="fineprint">At most {MAX_FORM_BUILDS} builds beside the vehicle as given.</p> : null}
      {message ? (
        <p className="field-error" role="alert">
          {message}
        </p>
      ) : null}
      <p className="fineprint">Undo (top bar, or Ctrl+Z outside a field) takes back each change. How each change is modelled: see the list under the comparison.</p>
    </fieldset>
  );
}
