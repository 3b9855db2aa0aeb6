/**
 * The garage's logic over an in-memory key-value store (the app uses IndexedDB with the same
 * operations; the browser test tests/e2e/safetyGarage.test.ts covers that): save with name,
 * customer or unit number and date; open, duplicate, rename, delete; export all and import; a
 * damaged entry is listed as damaged and never takes the others with it.
 */
import { describe, expect, it } from 'vitest';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario, scenarioToFile, type Scenario } from '../../src/core';
import { GARAGE_FORMAT, Garage } from '../../src/store/garage';
import { memoryKeyValue } from '../../src/store/idb';

function demoScenario(): Scenario {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  return p.scenario;
}

function clock() {
  let t = Date.UTC(2026, 11, 2, 9, 0, 0);
  return () => (t += 60_000);
}

describe('garage', () => {
  it('keeps three units with name, unit number and date; open gives back the same scenario file', async () => {
    const kv = memoryKeyValue();
    const g = new Garage(kv, clock());
    const s = demoScenario();
    for (const unit of ['LV-101', 'LV-102', 'LV-103']) await g.save({ ...s, pose: { ...s.pose, xM: Number(unit.slice(-1)) } }, 'metric', { name: `Site truck ${unit}`, customer: unit });
    const items = await g.list();
    expect(items.map((i) => (i.ok ? i.entry.customer : 'damaged'))).toEqual(['LV-103', 'LV-102', 'LV-101']);
    const first = items[2];
    if (!first.ok) throw new Error('damaged');
    expect(first.entry.name).toBe('Site truck LV-101');
    expect(first.entry.savedAtMs).toBe(Date.UTC(2026, 11, 2, 9, 1, 0));
    const opened = await g.open(first.entry.id);
    expect(opened?.ok && JSON.stringify(scenarioToFile(opened.scenario))).toBe(JSON.stringify(scenarioToFile({ ...s, pose: { ...s.pose, xM: 1 } })));
  });

  it('duplicate, rename and delete act on one entry only', async () => {
    const g = new Garage(memoryKeyValue(), clock());
    const a = await g.save(demoScenario(), 'imperial', { name: 'Customer build', customer: 'J. Farrow' });
    const b = await g.duplicate(a.id);
    expect(b.name).toBe('Customer build (copy)');
    expect(b.id).not.toBe(a.id);
    await g.rename(b.id, 'Customer build, 3 in lift', 'J. Farrow #2');
    await g.remove(a.id);
    const items = await g.list();
    expect(items).toHaveLength(1);
    expect(items[0].ok && [items[0].entry.name, items[0].entry.customer, items[0].entry.units]).toEqual(['Customer build, 3 in lift', 'J. Farrow #2', 'imperial']);
  });

  it('a damaged entry is listed as damaged, and the others still open, export and import', async () => {
    const kv = memoryKeyValue();
    const g = new Garage(kv, clock());
    await g.save(demoScenario(), 'metric', { name: 'Good one', customer: 'U-7' });
    kv.map.set('broken-1', { name: 'Half written', savedAtMs: 5, file: { version: 1, vehicle: { mass: -3 } } });
    kv.map.set('broken-2', 'not an object');
    kv.map.set('broken-3', { name: 'No date', file: scenarioToFile(demoScenario()) });
    const items = await g.list();
    expect(items).toHaveLength(4);
    expect(items.filter((i) => i.ok)).toHaveLength(1);
    const bad = items.filter((i) => !i.ok);
    const problems = bad.map((i) => (!i.ok ? i.problem : ''));
    expect(problems).toHaveLength(3);
    expect(problems).toEqual(expect.arrayContaining(['the entry has no valid date', 'the entry is not readable', expect.stringMatching(/^the scenario does not validate \(/)]));
    const exp = await g.exportAll();
    expect(exp).toMatchObject({ exported: 1, skipped: 3 });
    const file = JSON.parse(exp.text);
    expect(file.format).toBe(GARAGE_FORMAT);
    // Into a new garage: the good entry arrives; a bad entry added to the file is refused by itself.
    file.entries.push({ name: 'Tampered', savedAtMs: 1, file: { version: 1 } });
    const g2 = new Garage(memoryKeyValue(), clock());
    const r = await g2.importText(JSON.stringify(file));
    expect(r.added).toBe(1);
    expect(r.refused).toHaveLength(1);
    expect(r.refused[0]).toMatch(/^entries\[1\] \(Tampered\): the scenario does not validate/);
    const l2 = await g2.list();
    expect(l2[0].ok && [l2[0].entry.name, l2[0].entry.customer]).toEqual(['Good one', 'U-7']);
    // Not a garage file at all.
    expect((await g2.importText('{"version":1}')).refused[0]).toMatch(/not a garage file/);
    expect((await g2.importText('{')).refused[0]).toMatch(/not valid JSON/);
  });

  it('names lose control characters and are kept to 200 characters', async () => {
    const g = new Garage(memoryKeyValue(), clock());
    const e = await g.save(demoScenario(), 'metric', { name: 'Unit\u001b]52;c;AAAA\u0007 9' + 'x'.repeat(500), customer: '\r\nU-9' });
    expect(e.name).not.toMatch(/\p{Cc}/u);
    expect(e.name.length).toBe(200);
    expect(e.customer).toBe('U-9');
  });
});
