import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { LIBRARY_MATERIALS } from '../materials/library';
import { docFromSnapshot, readSection } from './doc';
import { keyBetween, keysBetween, isOrderKey } from './order';
import type { ParamSpec } from './params';
import { PART_KINDS } from './registry';
import type { PartRecord, SectionSnapshot } from './schema';
import { PART_COMMON_FIELDS } from './schema';
import { TEMPLATES, blankSection } from './templates';
import { normalise, parseSectionText, validateSection } from './validate';

describe('templates', () => {
  it('every template is valid and round-trips file -> document -> file losslessly', () => {
    for (const t of TEMPLATES) {
      const s = t.build();
      const v = validateSection(s);
      expect(v.ok, JSON.stringify(!v.ok && v.problems)).toBe(true);
      const text = JSON.stringify(s);
      const parsed = parseSectionText(text);
      if (!parsed.ok) throw new Error('template did not parse');
      const back = readSection(docFromSnapshot(parsed.section));
      if (!back.ok) throw new Error('document did not read back');
      expect(back.section).toEqual(parsed.section);
      expect(JSON.stringify(back.section)).toBe(JSON.stringify(parsed.section));
    }
  });
  it('every template has soil, an indoor zone and an exterior zone, and extends per ISO 10211 (recalled from memory: 2.5 b beside and below, b = 8 m)', () => {
    for (const t of TEMPLATES) {
      const s = t.build();
      expect(s.parts.some((p) => p.kind === 'soil')).toBe(true);
      expect(s.zones.some((z) => z.kind === 'indoor')).toBe(true);
      expect(s.zones.some((z) => z.kind === 'outdoor')).toBe(true);
      const soil = s.parts.filter((p) => p.kind === 'soil');
      expect(Math.min(...soil.map((p) => p.x as number))).toBeLessThanOrEqual(-20);
      expect(Math.min(...soil.map((p) => p.y as number))).toBeLessThanOrEqual(-20);
    }
  });
});

describe('part kinds', () => {
  it('no kind parameter reuses a common field name', () => {
    for (const k of PART_KINDS) for (const key of Object.keys(k.params)) expect(PART_COMMON_FIELDS as readonly string[]).not.toContain(key);
  });
  it('every kind yields valid pieces with its defaults', () => {
    for (const k of PART_KINDS) {
      const s = blankSection();
      s.parts.push({ id: 'a', kind: k.kind, name: '', material: k.defaultMaterial, order: 'V', locked: false, join: null, x: 0, y: 0 } as PartRecord);
      const v = validateSection(s);
      expect(v.ok, `${k.kind}: ${JSON.stringify(!v.ok && v.problems)}`).toBe(true);
    }
  });
});

describe('materials library', () => {
  it('has at least 25 materials, each value with a source or "from memory"', () => {
    expect(LIBRARY_MATERIALS.length).toBeGreaterThanOrEqual(25);
    for (const m of LIBRARY_MATERIALS) {
      for (const key of ['lambda', 'mu', 'density'] as const) expect(m.source[key], `${m.id}.${key}`).toMatch(/ISO 10456|ISO 13370|ASHRAE|from memory/);
      expect(m.lambda).toBeGreaterThan(0);
      expect(m.mu !== null || m.sd !== null).toBe(true);
    }
  });
  it('marks batts and open-cell foam as air-open and board foams as airtight', () => {
    const by = new Map(LIBRARY_MATERIALS.map((m) => [m.id, m]));
    for (const id of ['mineral-wool-batt', 'glass-fibre-batt', 'spf-open', 'cellulose']) expect(by.get(id)!.airOpen).toBe(true);
    for (const id of ['xps', 'eps', 'polyiso', 'spf-closed', 'concrete-2300-rc']) expect(by.get(id)!.airOpen).toBe(false);
  });
  it('ground conductivities follow ISO 13370 (recalled from memory): sand or gravel 2.0, clay or silt 1.5, rock 3.5 W/(m K)', () => {
    const by = new Map(LIBRARY_MATERIALS.map((m) => [m.id, m]));
    expect(by.get('soil-sand-gravel')!.lambda).toBe(2.0);
    expect(by.get('soil-clay-silt')!.lambda).toBe(1.5);
    expect(by.get('rock')!.lambda).toBe(3.5);
  });
});

describe('stacking keys', () => {
  it('always fit between two keys and never end in 0', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 1000 }), { minLength: 1, maxLength: 60 }), (picks) => {
        const keys: string[] = [];
        for (const pick of picks) {
          const i = pick % (keys.length + 1);
          const k = keyBetween(i > 0 ? keys[i - 1] : null, i < keys.length ? keys[i] : null);
          expect(isOrderKey(k)).toBe(true);
          keys.splice(i, 0, k);
        }
        expect([...keys].sort()).toEqual(keys);
      }),
      { numRuns: 200 },
    );
    expect(keysBetween(null, null, 5)).toEqual([...keysBetween(null, null, 5)].sort());
  });
});

// ---- property tests ------------------------------------------------------------------------------

function arbParam(spec: ParamSpec): fc.Arbitrary<unknown> {
  switch (spec.type) {
    case 'number': {
      const lo = spec.typical?.[0] ?? Math.max(spec.min, 0.001), hi = spec.typical?.[1] ?? Math.min(spec.max, lo + 1);
      return fc.double({ min: lo, max: hi, noNaN: true });
    }
    case 'choice':
      return fc.constantFrom(...spec.options.map((o) => o.value));
    case 'flag':
      return fc.boolean();
    case 'material':
      return fc.constant(spec.default);
    case 'ring':
      return fc.tuple(fc.double({ min: 0.1, max: 2, noNaN: true }), fc.double({ min: 0.1, max: 2, noNaN: true })).map(([w, h]) => [[0, 0], [w, 0], [w / 2, h], [0, 0]]);
  }
}

const arbPart = (i: number) =>
  fc.constantFrom(...PART_KINDS).chain((k) =>
    fc
      .record({
        x: fc.double({ min: -5, max: 5, noNaN: true }),
        y: fc.double({ min: -5, max: 5, noNaN: true }),
        params: fc.record(Object.fromEntries(Object.entries(k.params).map(([key, spec]) => [key, arbParam(spec)]))),
        name: fc.string({ maxLength: 20 }),
      })
      .map(({ x, y, params, name }) => ({ id: `p${i}`, kind: k.kind, name, material: k.defaultMaterial, order: 'V', locked: false, join: null, x, y, ...params }) as PartRecord),
  );

const arbSection: fc.Arbitrary<SectionSnapshot> = fc.integer({ min: 1, max: 8 }).chain((n) =>
  fc.tuple(...Array.from({ length: n }, (_, i) => arbPart(i))).map((parts) => {
    const keys = keysBetween(null, null, parts.length);
    const s = blankSection('random');
    s.parts = parts.map((p, i) => ({ ...p, order: keys[i] }));
    s.zones = [{ id: 'z1', kind: 'indoor', name: 'room', order: 'V', shape: { type: 'rect', x: -1, y: -1, width: 2, height: 2 }, rs: 'auto', design: { t: 20, rh: 50 }, month: { t: 20, rh: 50 } }];
    return s;
  }),
);

describe('property: random valid documents round-trip', () => {
  it('file -> document -> file is lossless for every valid random section (200 runs)', () => {
    let valid = 0;
    fc.assert(
      fc.property(arbSection, (s) => {
        const v = validateSection(s);
        if (!v.ok) return; // cross-parameter rules can refuse a random combination; that is tested below
        valid++;
        const text = JSON.stringify(v.section);
        const again = parseSectionText(text);
        expect(again.ok).toBe(true);
        if (!again.ok) return;
        expect(again.section).toEqual(v.section);
        const back = readSection(docFromSnapshot(again.section));
        expect(back.ok).toBe(true);
        if (back.ok) expect(back.section).toEqual(normalise(v.section));
      }),
      { numRuns: 200 },
    );
    expect(valid).toBeGreaterThan(100);
  });
});

describe('property: random mutations are valid or refused with a message, never a crash', () => {
  const hostile = fc.oneof(
    fc.constant(null), fc.constant(undefined), fc.constant(-0.02), fc.constant(0), fc.constant(1e308), fc.constant(Number.NaN),
    fc.constant(''), fc.string({ maxLength: 12 }), fc.constant([]), fc.constant({}), fc.constant([[0, 0]]), fc.boolean(), fc.double(),
  );
  const base = TEMPLATES.map((t) => t.build());
  function paths(v: unknown, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
    out.push(prefix);
    if (Array.isArray(v)) v.forEach((x, i) => paths(x, [...prefix, i], out));
    else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) paths(x, [...prefix, k], out);
    return out;
  }
  it('holds for 300 random mutations of the templates', () => {
    fc.assert(
      fc.property(fc.nat(), fc.nat(), hostile, fc.boolean(), (ti, pi, value, remove) => {
        const s = JSON.parse(JSON.stringify(base[ti % base.length]));
        const all = paths(s).filter((p) => p.length > 0);
        const path = all[pi % all.length];
        let target = s;
        for (const seg of path.slice(0, -1)) target = target[seg];
        const last = path[path.length - 1];
        if (remove && !Array.isArray(target)) delete target[last];
        else target[last] = value;
        let v;
        expect(() => (v = validateSection(s))).not.toThrow();
        const r = v as unknown as ReturnType<typeof validateSection>;
        if (!r.ok) {
          expect(r.problems.length).toBeGreaterThan(0);
          for (const p of r.problems) {
            expect(typeof p.path).toBe('string');
            expect(p.message.length).toBeGreaterThan(3);
          }
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe('JSON Schema', () => {
  it('docs/section.schema.json is the one generated from the zod schema (run npm run schema after changing it)', async () => {
    const fs = await import('node:fs');
    const path = await import('node:path');
    const { sectionJsonSchema } = await import('./json-schema');
    const onDisk = fs.readFileSync(path.resolve(__dirname, '../../docs/section.schema.json'), 'utf8');
    expect(JSON.parse(onDisk)).toEqual(JSON.parse(JSON.stringify(sectionJsonSchema())));
  });
});
