/**
 * Reading a scenario file before validation (read.ts), the same in the app and the CLI:
 * duplicate keys, control characters in names, reserved build names, the byte-size limit, the
 * encodings (UTF-8 with or without a byte-order mark, UTF-16 with one, read; UTF-16 without one,
 * UTF-32 and invalid UTF-8, refused with the encoding named). Byte-order marks and the UTF-16 and
 * UTF-8 byte layouts per the Unicode Standard, chapter 3 (D91–D98) and RFC 8259 §8.1.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  SCENARIO_LIMITS,
  fileSizeProblem,
  parseScenario,
  parseScenarioBytes,
  parseScenarioText,
  scanScenarioJson,
} from '../../../src/core/index';
import { baseFile, edit } from './helpers';

const messages = (r: ReturnType<typeof parseScenario>): string[] => (r.ok ? [] : r.errors.map((e) => `${e.path}: ${e.message}`));
const BASE = JSON.stringify(baseFile(), null, 2);

describe('duplicate keys are refused with the key named', () => {
  it('vehicle.mass given twice (2000 then 21500): refused, not the last one silently', () => {
    const text = BASE.replace('"mass": 2000,', '"mass": 2000,\n    "mass": 21500,');
    expect(text).not.toBe(BASE);
    expect(messages(parseScenarioText(text))).toEqual([
      'vehicle.mass: duplicate key "mass" in this object (each key once; JSON readers would keep only the last)',
    ]);
  });
  it('in a list element, and written with an escape (\\u006d = "m")', () => {
    const o = baseFile();
    const text = JSON.stringify(o).replace('"type":"step",', '"type":"step","\\u0074ype":"step",');
    expect(messages(parseScenarioText(text))).toEqual([
      'terrain.features[1].type: duplicate key "type" in this object (each key once; JSON readers would keep only the last)',
    ]);
  });
  it('the same key in different objects is fine', () => {
    expect(messages(parseScenarioText(BASE))).toEqual([]);
    expect(scanScenarioJson('{"a":{"x":1},"b":{"x":2},"c":[{"x":1},{"x":2}]}')).toEqual([]);
  });
});

describe('control characters in names are refused at parse time, with the field named', () => {
  const cases: [string, string, string, string][] = [
    ['ESC (a terminal title change)', 'vehicle.name', 'Wagon\u001b]0;owned\u0007', 'U+001B (ESC) at character 6'],
    ['BEL', 'name', 'Bench\u0007', 'U+0007 (BEL) at character 6'],
    ['NUL', 'vehicle.name', 'a\u0000b', 'U+0000 (NUL) at character 2'],
    ['DEL', 'name', 'x\u007f', 'U+007F (DEL) at character 2'],
    ['C1 CSI', 'vehicle.name', '\u009b2J', 'U+009B (CSI) at character 1'],
    ['a tab in a name', 'name', 'a\tb', 'U+0009 (tab) at character 2'],
    ['a line break in a name', 'vehicle.name', 'a\nb', 'U+000A (line feed) at character 2'],
  ];
  it.each(cases)('%s', (_what, path, value, where) => {
    expect(messages(parseScenario(edit(baseFile(), path, value)))).toEqual([`${path}: must not contain control characters, got ${where}`]);
  });
  it('payload labels and build names too', () => {
    const o = edit(baseFile(), 'vehicle.payload', [{ label: 'tent\u001b[2J', mass: 60, behindFrontAxle: 1.4, height: 2 }]);
    o.builds = [{ name: 'lift\u0085' }];
    expect(messages(parseScenario(o))).toEqual([
      'vehicle.payload[0].label: must not contain control characters, got U+001B (ESC) at character 5',
      'builds[0].name: must not contain control characters, got U+0085 (a C1 control) at character 5',
    ]);
  });
  it('notes may hold tabs and line breaks, not ESC', () => {
    expect(messages(parseScenario(edit(baseFile(), 'notes', 'line 1\r\n\tline 2')))).toEqual([]);
    expect(messages(parseScenario(edit(baseFile(), 'notes', 'ok\u001b[31m')))).toEqual([
      'notes: must not contain control characters (other than tab and line breaks), got U+001B (ESC) at character 3',
    ]);
  });
});

describe('reserved build names', () => {
  it.each(['as given', 'As Given', ' as given '])('%j is refused', (name) => {
    const o = baseFile();
    o.builds = [{ name }];
    expect(messages(parseScenario(o))).toEqual([
      `builds[0].name: ${JSON.stringify(name)} is reserved for the vehicle without modifications (the first column of a comparison); choose another name`,
    ]);
  });
});

describe('size, from the file size before reading', () => {
  it(`${SCENARIO_LIMITS.fileBytes} bytes pass, one more is refused naming the limit`, () => {
    expect(fileSizeProblem(SCENARIO_LIMITS.fileBytes)).toBeNull();
    expect(fileSizeProblem(150 * 1024 * 1024)).toBe('must be at most 134217728 bytes (128 MiB), got 157286400 bytes (150.0 MiB)');
  });
});

describe('encodings', () => {
  const utf16le = (s: string) => {
    const b = new Uint8Array(2 + 2 * s.length);
    b[0] = 0xff;
    b[1] = 0xfe;
    for (let i = 0; i < s.length; i++) {
      b[2 + 2 * i] = s.charCodeAt(i) & 0xff;
      b[3 + 2 * i] = s.charCodeAt(i) >> 8;
    }
    return b;
  };
  const utf16be = (s: string) => {
    const le = utf16le(s);
    const b = new Uint8Array(le.length);
    for (let i = 0; i < le.length; i += 2) {
      b[i] = le[i + 1];
      b[i + 1] = le[i];
    }
    return b;
  };
  const utf8 = (s: string) => new TextEncoder().encode(s);

  it('UTF-8, with and without a byte-order mark, reads the same scenario', () => {
    const a = parseScenarioBytes(utf8(BASE));
    const b = parseScenarioBytes(new Uint8Array([0xef, 0xbb, 0xbf, ...utf8(BASE)]));
    expect(messages(a)).toEqual([]);
    expect(b).toEqual(a);
  });
  it('UTF-16 with a byte-order mark (LE and BE) reads the same scenario, a non-ASCII name included', () => {
    const text = JSON.stringify(edit(baseFile(), 'vehicle.name', 'Wagen Größe 2 — Ōtaki'));
    const ref = parseScenarioText(text);
    expect(messages(ref)).toEqual([]);
    expect(parseScenarioBytes(utf16le(text))).toEqual(ref);
    expect(parseScenarioBytes(utf16be(text))).toEqual(ref);
  });
  it('UTF-16 without a byte-order mark is refused with the encoding named (no NUL bytes echoed)', () => {
    const le = utf16le(BASE).subarray(2);
    const be = utf16be(BASE).subarray(2);
    expect(messages(parseScenarioBytes(le))).toEqual([
      '(file): looks like UTF-16 little-endian text without a byte-order mark; save it as UTF-8 (or UTF-16 with a byte-order mark)',
    ]);
    expect(messages(parseScenarioBytes(be))).toEqual([
      '(file): looks like UTF-16 big-endian text without a byte-order mark; save it as UTF-8 (or UTF-16 with a byte-order mark)',
    ]);
  });
  it('UTF-32 and invalid UTF-8 are refused with the encoding named', () => {
    expect(messages(parseScenarioBytes(new Uint8Array([0xff, 0xfe, 0, 0, 0x7b, 0, 0, 0])))).toEqual([
      '(file): is UTF-32 text; save it as UTF-8 (or UTF-16 with a byte-order mark)',
    ]);
    // 0xC3 0x28: a two-byte lead followed by a non-continuation byte (Unicode §3.9, Table 3-7).
    expect(messages(parseScenarioBytes(new Uint8Array([0x7b, 0x22, 0xc3, 0x28, 0x22, 0x7d])))).toEqual([
      '(file): is not valid UTF-8 text; save the scenario as UTF-8 JSON',
    ]);
  });
  it('a JSON error never echoes a control character raw', () => {
    const r = parseScenarioText('{"name": "a"\u0007}');
    expect(r.ok).toBe(false);
    // eslint-disable-next-line no-control-regex -- looking for control characters is the point here
    for (const m of messages(r)) expect(m).not.toMatch(/[\u0000-\u001f\u007f-\u009f]/);
  });
});

describe('the demo files pass the scan', () => {
  it.each(['side-hill-stock', 'quarry-haul-road-utv', 'trials-course'])('%s', (name) => {
    expect(scanScenarioJson(readFileSync(`assets/scenarios/${name}.json`, 'utf8'))).toEqual([]);
  });
  it('and the scan is what JSON.parse reads (every key of the demo is seen once)', () => {
    const unique = scanScenarioJson('{"a":1,"b":[1,2,{"a":2,"b":3}],"c":"x\\"y","d":{"a":{"a":1}}}');
    expect(unique).toEqual([]);
    expect(scanScenarioJson('{"a":1,"b":[1,2,{"a":2,"a":3}]}')).toEqual([
      { path: 'b[2].a', message: 'duplicate key "a" in this object (each key once; JSON readers would keep only the last)' },
    ]);
  });
});
