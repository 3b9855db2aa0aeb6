/**
 * The garage: several vehicles and scenarios kept in the browser (IndexedDB), each with a name,
 * a customer or unit number and the date it was saved. Open, duplicate, rename, delete, export
 * all to one file, import such a file. Each entry is stored and checked on its own: a damaged
 * entry is listed as damaged (and can be deleted) and never takes the others with it.
 *
 * Entries hold the scenario in its file form (scenarioToFile), so opening one goes through the
 * same validation as opening a file.
 */
import { parseScenario, scenarioToFile, type Scenario, type UnitSystem } from '../core';
import { idbStore, type AsyncKeyValue } from './idb';

export interface GarageEntry {
  readonly id: string;
  /** What the user calls it (defaults to the scenario's name). */
  readonly name: string;
  /** Customer, job or unit number (free text; may be empty). */
  readonly customer: string;
  readonly savedAtMs: number;
  readonly units: UnitSystem;
  /** The scenario file form. */
  readonly file: unknown;
}

export type GarageItem =
  | { readonly ok: true; readonly entry: GarageEntry; readonly scenario: Scenario }
  | { readonly ok: false; readonly id: string; readonly name: string; readonly problem: string };

/** The export file's format marker. */
export const GARAGE_FORMAT = 'plumbline-garage';
export const GARAGE_FORMAT_VERSION = 1;
/** Longest name and customer text kept (characters). */
export const GARAGE_TEXT_MAX = 200;
/** Most entries in one garage (and one import). */
export const GARAGE_MAX_ENTRIES = 1000;

const clean = (s: unknown, fallback: string): string => {
  const t = typeof s === 'string' ? s.replace(/[\p{Cc}]/gu, ' ').trim().slice(0, GARAGE_TEXT_MAX) : '';
  return t || fallback;
};

/** Checks one stored record: the entry and its scenario, or what is wrong with it. */
export function checkEntry(id: string, value: unknown): GarageItem {
  if (!value || typeof value !== 'object') return { ok: false, id, name: id, problem: 'the entry is not readable' };
  const v = value as Partial<GarageEntry>;
  const name = typeof v.name === 'string' ? clean(v.name, id) : id;
  if (typeof v.savedAtMs !== 'number' || !Number.isFinite(v.savedAtMs)) return { ok: false, id, name, problem: 'the entry has no valid date' };
  const parsed = parseScenario(v.file);
  if (!parsed.ok) {
    const first = parsed.errors[0];
    return { ok: false, id, name, problem: `the scenario does not validate (${first ? `${first.path}: ${first.message}` : 'unknown'})` };
  }
  const entry: GarageEntry = {
    id,
    name,
    customer: clean(v.customer, ''),
    savedAtMs: v.savedAtMs,
    units: v.units === 'imperial' ? 'imperial' : 'metric',
    file: v.file,
  };
  return { ok: true, entry, scenario: parsed.scenario };
}

let idCounter = 0;
const newId = (nowMs: number): string => `g-${nowMs.toString(36)}-${Math.random().toString(36).slice(2, 8)}-${idCounter++}`;

export class Garage {
  private readonly listeners = new Set<() => void>();

  constructor(
    private readonly backend: AsyncKeyValue,
    private readonly nowMs: () => number = () => Date.now(),
  ) {}

  /** Called after every change made through this object. Returns the unsubscribe. */
  subscribe(fn: () => void): () => void {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  }

  private changed(): void {
    for (const fn of this.listeners) fn();
  }

  /** Every entry, newest first; damaged ones included as such. */
  async list(): Promise<GarageItem[]> {
    let rows: { key: string; value: unknown }[];
    try {
      rows = await this.backend.all();
    } catch {
      return [];
    }
    const items = rows.map((r) => checkEntry(r.key, r.value));
    const date = (i: GarageItem) => (i.ok ? i.entry.savedAtMs : -Infinity);
    return items.sort((a, b) => date(b) - date(a));
  }

  /** Saves a scenario as a new entry. */
  async save(scenario: Scenario, units: UnitSystem, meta: { name?: string; customer?: string } = {}): Promise<GarageEntry> {
    const count = (await this.backend.all()).length;
    if (count >= GARAGE_MAX_ENTRIES) throw new Error(`the garage holds at most ${GARAGE_MAX_ENTRIES} entries; delete some first`);
    const now = this.nowMs();
    const entry: GarageEntry = {
      id: newId(now),
      name: clean(meta.name, scenario.name || 'Untitled'),
      customer: clean(meta.customer, ''),
      savedAtMs: now,
      units,
      file: scenarioToFile(scenario),
    };
    await this.backend.put(entry.id, entry);
    this.changed();
    return entry;
  }

  /** One entry, checked; null when there is no such entry. */
  async open(id: string): Promise<GarageItem | null> {
    const v = await this.backend.get(id);
    return v === undefined ? null : checkEntry(id, v);
  }

  async duplicate(id: string): Promise<GarageEntry> {
    const item = await this.open(id);
    if (!item || !item.ok) throw new Error('only a readable entry can be duplicated');
    const now = this.nowMs();
    const copy: GarageEntry = { ...item.entry, id: newId(now), name: clean(`${item.entry.name} (copy)`, 'copy'), savedAtMs: now };
    await this.backend.put(copy.id, copy);
    this.changed();
    return copy;
  }

  async rename(id: string, name: string, customer?: string): Promise<GarageEntry> {
    const item = await this.open(id);
    if (!item || !item.ok) throw new Error('only a readable entry can be renamed');
    const next: GarageEntry = { ...item.entry, name: clean(name, item.entry.name), customer: customer === undefined ? item.entry.customer : clean(customer, '') };
    await this.backend.put(id, next);
    this.changed();
    return next;
  }

  async remove(id: string): Promise<void> {
    await this.backend.delete(id);
    this.changed();
  }

  /** Every readable entry in one JSON file (damaged ones are left out and counted). */
  async exportAll(): Promise<{ text: string; exported: number; skipped: number }> {
    const items = await this.list();
    const good = items.filter((i): i is Extract<GarageItem, { ok: true }> => i.ok);
    const entries = good.map((i) => ({ name: i.entry.name, customer: i.entry.customer, savedAtMs: i.entry.savedAtMs, units: i.entry.units, file: i.entry.file }));
    const text = JSON.stringify({ format: GARAGE_FORMAT, version: GARAGE_FORMAT_VERSION, entries }, null, 1);
    return { text, exported: good.length, skipped: items.length - good.length };
  }

  /**
   * Adds the entries of an exported garage file (as new entries, never replacing one). Each entry is
   * checked on its own: the good ones are added, the bad ones listed with their problem.
   */
  async importText(text: string): Promise<{ added: number; refused: string[] }> {
    let data: unknown;
    try {
      data = JSON.parse(text);
    } catch (e) {
      return { added: 0, refused: [`not valid JSON: ${(e as Error).message}`] };
    }
    const d = data as { format?: unknown; version?: unknown; entries?: unknown };
    if (!d || typeof d !== 'object' || d.format !== GARAGE_FORMAT) return { added: 0, refused: [`not a garage file (format must be "${GARAGE_FORMAT}")`] };
    if (d.version !== GARAGE_FORMAT_VERSION) return { added: 0, refused: [`garage file version ${String(d.version)} is not supported (expected ${GARAGE_FORMAT_VERSION})`] };
    if (!Array.isArray(d.entries)) return { added: 0, refused: ['entries: must be a list'] };
    const have = (await this.backend.all()).length;
    const refused: string[] = [];
    let added = 0;
    for (const [i, raw] of d.entries.entries()) {
      if (have + added >= GARAGE_MAX_ENTRIES) {
        refused.push(`entries[${i}] and after: the garage holds at most ${GARAGE_MAX_ENTRIES} entries`);
        break;
      }
      const now = this.nowMs();
      const id = newId(now);
      const r = raw as Partial<GarageEntry> | null;
      const item = checkEntry(id, r && typeof r === 'object' ? { ...r, savedAtMs: typeof r.savedAtMs === 'number' ? r.savedAtMs : now } : r);
      if (!item.ok) {
        refused.push(`entries[${i}] (${item.name === id ? 'no name' : item.name}): ${item.problem}`);
        continue;
      }
      await this.backend.put(id, item.entry);
      added++;
    }
    if (added > 0) this.changed();
    return { added, refused };
  }
}

let shared: Garage | null | undefined;
/** The app's garage in IndexedDB; null where the browser has none. */
export function browserGarage(): Garage | null {
  if (shared === undefined) {
    const store = idbStore('garage');
    shared = store ? new Garage(store) : null;
  }
  return shared;
}
