// Catalogue format version 2: one entry per equilibrium found (a candidate may have several), the search
// recorded (starts, saddles); version 1 files still read; the schema; several entries of one candidate
// through a sharded ranking and its merge, byte for byte in any order.
//
// The second equilibrium of a candidate is a genuine one: the lens of arrangement 3.2 at equal areas
// slides along its host wall's circle at constant perimeter and areas (a one-parameter family: common
// practice, no source; design.md §7), re-certified here with the independent checker.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { CATALOGUE_SCHEMA_URL, readCatalogue, writeCatalogue } from '../../src/catalogue/format.ts';
import { assembleCatalogue, planRanking, rankAreas, unrankedEntries } from '../../src/catalogue/rank.ts';
import { evaluateCluster } from '../../src/catalogue/evaluate.ts';
import { readPart, rankShard, writePart } from '../../src/catalogue/shard.ts';
import type { Catalogue, CatalogueEntry } from '../../src/catalogue/types.ts';
import { CatalogueFormatError } from '../../src/errors.ts';
import { resolveArrangement } from '../../src/maps/resolve.ts';
import { checkEquilibrium } from '../../src/solver/certificate.ts';
import { lensHostOf, slideLensInto } from '../../src/solver/family.ts';
import { relax } from '../../src/solver/newton.ts';
import { problemOf } from '../../src/solver/problem.ts';
import { WALL_STRIDE, perimeterInto } from '../../src/solver/wall-terms.ts';
import { packageInfo } from '../../src/version.ts';
import { entryFacts } from '../../src/view/facts.ts';
import { lather } from '../cli/helpers.ts';

const FIXTURES = new URL('../fixtures/', import.meta.url);
// catalogues/equal-4.json as lather wrote it in format version 1 (before issue 11)
const VERSION_1 = readFileSync(new URL('catalogue-v1-equal-4.json', FIXTURES), 'utf8');
const dir = mkdtempSync(join(tmpdir(), 'lather-format-'));

describe('catalogue format version 2', () => {
  it('readCatalogue reads a version 1 file as version 2 says it: one start per candidate, no saddles searched', async () => {
    const v1 = JSON.parse(VERSION_1);
    expect(v1.version).toBe(1);
    const read = readCatalogue(VERSION_1, 'v1.json');
    expect(read.version).toBe(2);
    expect(read.query).toMatchObject({ starts: 1, unstable: false });
    expect(read.counts.saddles).toBe(v1.counts.equilibria - v1.counts.stable);
    for (const e of read.entries) {
      expect(e.tried).toBe(1);
      expect(e.family).toBeNull();
      expect(e.reached).toBe(e.status === 'ok' ? 1 : null);
    }
    // a fresh ranking, in version 2, has every version 1 field, the same candidates, and every
    // equilibrium the version 1 file lists (a search from more starts loses none: issue 11), at the
    // same perimeter to 1e-9
    const fresh = JSON.parse(writeCatalogue(await rankAreas([1, 1, 1, 1])));
    expect(fresh.version).toBe(2);
    for (const e of fresh.entries) for (const key of Object.keys(v1.entries[0])) expect(e, key).toHaveProperty(key);
    const candidates = (c: { entries: { code: string; assignment: number[] }[] }) => [...new Set(c.entries.map((e) => `${e.code} ${e.assignment}`))].sort();
    expect(candidates(fresh)).toEqual(candidates(v1));
    for (const old of v1.entries.filter((e: { status: string }) => e.status === 'ok')) {
      const same = fresh.entries.filter((e: CatalogueEntry) => e.code === old.code && e.status === 'ok' && Math.abs(e.perimeter! / old.perimeter - 1) < 1e-9);
      expect(same.length, old.id).toBeGreaterThanOrEqual(1);
    }
    // and `show` prints it
    const file = join(dir, 'v1.json');
    writeFileSync(file, VERSION_1);
    const shown = await lather(['show', file]);
    expect(shown.status, shown.stderr).toBe(0);
    expect(shown.stdout).toContain('5 certified equilibria (5 stable), 5 failures (5 wall-collapse)');
  });

  it('readCatalogue(writeCatalogue(c)) round-trips a version 2 catalogue, and writing it again gives the same bytes', async () => {
    // a round trip through the file (common practice, no source)
    const c = await rankAreas([1, 2, 2]);
    const text = writeCatalogue(c);
    const read = readCatalogue(text);
    expect(read).toEqual(JSON.parse(text));
    expect(writeCatalogue(read)).toBe(text);
    expect(Object.keys(read.query)).toEqual(['areas', 'filter', 'budgetSeconds', 'seed', 'starts', 'unstable']);
    expect(read.counts.equilibria).toBe(read.counts.stable + read.counts.saddles);
  });

  it('catalogues/catalogue.schema.json accepts a version 2 catalogue and refuses an entry without its search fields', async () => {
    // JSON Schema draft-07 through ajv, a reference validator
    const { Ajv } = createRequire(import.meta.url)('ajv') as typeof import('ajv');
    const validate = new Ajv({ strict: false }).compile(JSON.parse(readFileSync(CATALOGUE_SCHEMA_URL, 'utf8')));
    const data = JSON.parse(writeCatalogue(await rankAreas([1, 1, 1])));
    expect(validate(data), JSON.stringify(validate.errors)).toBe(true);
    for (const field of ['reached', 'tried', 'family']) {
      const bad = structuredClone(data);
      delete bad.entries[0][field];
      expect(validate(bad), field).toBe(false);
    }
    const noStarts = structuredClone(data);
    delete noStarts.query.starts;
    expect(validate(noStarts)).toBe(false);
    const outside = structuredClone(data);
    outside.entries[0].family = { cell: 1, walls: [0, 1], at: 1.5, from: 0, to: 1 };
    expect(validate(outside)).toBe(false);
  });
});

/** Arrangement 3.2 at equal areas, relaxed, and a second member of its lens family, both certified. */
function twoFamilyMembers() {
  const cluster = resolveArrangement('3.2');
  const areas = Float64Array.of(1, 1, 1);
  const e = relax(cluster.map, areas);
  const p = problemOf(cluster.map);
  const t0 = 2 * p.junctions;
  let host = null;
  for (let k = 0; k < p.walls && host === null; k++) host = lensHostOf(p, k);
  const z = new Float64Array(p.size);
  z.set(e.coords);
  z.set(e.bulges, t0);
  z.set(e.pressures, t0 + p.walls);
  const cache = new Float64Array(p.walls * WALL_STRIDE);
  const achieved = new Float64Array(3);
  const share = (state: Float64Array): number => {
    // the share of the host wall on ka's side: ka's length over ka's and kb's
    perimeterInto(p, state, cache, achieved);
    const length = (k: number) => {
      const a = 2 * p.starts[k];
      const b = 2 * p.ends[k];
      const c = Math.hypot(state[b] - state[a], state[b + 1] - state[a + 1]);
      const t = state[t0 + k];
      return Math.abs(t) < 1e-12 ? c : (c * t) / Math.sin(t);
    };
    return length(host!.ka) / (length(host!.ka) + length(host!.kb));
  };
  const moved = Float64Array.from(z);
  expect(slideLensInto(p, moved, host!, -0.1)).toBe(true);
  const perimeter = perimeterInto(p, moved, cache, achieved);
  const geometry = { coords: moved.subarray(0, t0), bulges: moved.subarray(t0, t0 + p.walls), pressures: e.pressures };
  return { cluster, host: host!, e, at: [share(z), share(moved)], moved: { perimeter, geometry, certificate: checkEquilibrium(cluster.map, areas, geometry) } };
}

describe('several equilibria of one candidate', () => {
  it('a sharded ranking with two members of a lens family for one candidate merges byte for byte in any order', async () => {
    // sharding must not change a ranking (common practice, no source)
    const { host, e, at, moved } = twoFamilyMembers();
    expect(e.status).toBe('ok');
    expect(Math.abs(moved.perimeter / e.perimeter - 1)).toBeLessThan(1e-10); // the family keeps its perimeter
    expect(moved.certificate.tangentResidual).toBeLessThan(1e-10); // and is an equilibrium
    const program = packageInfo().version;
    const shards = await Promise.all([1, 2].map((i) => rankShard([1, 1, 1], { index: i, count: 2 }, program)));
    const holder = shards.find((s) => s.entries.some((x) => x.id === '3.2'))!;
    const first = holder.entries.find((x) => x.id === '3.2')!;
    expect(first.status).toBe('ok');
    const family = (share: number) => ({ cell: host.cell + 1, walls: [host.ka, host.kb] as [number, number], at: share, from: 0, to: 1 });
    first.family = family(at[0]);
    const second: CatalogueEntry = {
      ...structuredClone(first), perimeter: moved.perimeter, reached: 0, family: family(at[1]),
      geometry: { coords: [...moved.geometry.coords], bulges: [...moved.geometry.bulges] }, certificate: { ...moved.certificate },
    };
    holder.entries.push(second);
    const files = shards.map((s, i) => {
      const file = join(dir, `family.part${i + 1}.json`);
      writeFileSync(file, writePart(readPart(writePart(s), file)));
      return file;
    });
    const outputs: string[] = [];
    for (const order of [[0, 1], [1, 0]]) {
      const out = join(dir, `family-${order.join('')}.json`);
      const r = await lather(['merge', ...order.map((i) => files[i]), '--out', out]);
      expect(r.status, r.stderr).toBe(0);
      outputs.push(readFileSync(out, 'utf8'));
    }
    expect(outputs[1]).toBe(outputs[0]);
    const merged: Catalogue = readCatalogue(outputs[0]);
    const single = await rankAreas([1, 1, 1]);
    const ofLens = merged.entries.filter((x) => x.id === '3.2');
    expect(ofLens).toHaveLength(2);
    expect(ofLens.map((x) => x.family!.at).sort()).toEqual([...at].map((x) => Number(x.toPrecision(12))).sort());
    expect(merged.counts.equilibria).toBe(single.counts.equilibria + 1);
    expect(merged.counts.tried).toBe(single.counts.tried); // candidates relaxed, not entries
    expect(merged.counts.candidates).toBe(single.counts.candidates);
    // the viewer keys each entry apart, and `lather view` writes the page
    const keys = entryFacts(merged.entries).map((f) => f.key);
    expect(new Set(keys).size).toBe(keys.length);
    const page = await lather(['view', join(dir, 'family-01.json'), '--out', join(dir, 'family.html')]);
    expect(page.status, page.stderr).toBe(0);
    // show prints both members with their lens range
    const shown = await lather(['show', join(dir, 'family-01.json')]);
    expect(shown.stdout.match(new RegExp(`ok, lens ${host.cell + 1} slides 0-1 of walls ${host.ka}\\+${host.kb}`, 'g'))).toHaveLength(2);
  });

  it('readCatalogue refuses a repeated equilibrium of one candidate, and more starts reaching it than were tried', async () => {
    const c = JSON.parse(writeCatalogue(await rankAreas([1, 1, 1])));
    const twice = structuredClone(c);
    twice.entries.splice(1, 0, { ...structuredClone(c.entries[0]), rank: 2, reached: 0 });
    twice.entries.forEach((x: CatalogueEntry, k: number) => {
      if (x.rank !== null) x.rank = k + 1;
    });
    twice.counts.equilibria++;
    twice.counts.stable++;
    const gap = (x: CatalogueEntry) => (100 * (x.perimeter! - twice.entries[0].perimeter)) / twice.entries[0].perimeter;
    for (const x of twice.entries) if (x.rank !== null) x.gapPercent = gap(x);
    expect(() => readCatalogue(JSON.stringify(twice), 'twice.json')).toThrow(CatalogueFormatError);
    expect(() => readCatalogue(JSON.stringify(twice), 'twice.json')).toThrow(/repeats an equilibrium of its candidate/);
    const reached = structuredClone(c);
    const tried = reached.entries[0].tried;
    reached.entries[0].reached = tried + 1;
    expect(() => readCatalogue(JSON.stringify(reached), 'reached.json')).toThrow(new RegExp(`reached by ${tried + 1} starts when expected at most the ${tried} tried`));
  });
});

describe('rank 1 is stable', () => {
  it('a saddle below every stable equilibrium is ranked after the least stable one, and a file ranking it first is refused', () => {
    // the least perimeter over all arrangements is a minimiser, hence stable (index 0: the definition
    // of the index); a saddle found below it means the search missed that minimiser, and rank 1 stays
    // the ranking's answer. Here the triple bubble's entry is relabelled index 1 to stand for such a saddle.
    const plan = planRanking([1, 1, 1]);
    const entries = plan.tasks.flatMap((t, k) => unrankedEntries(plan, k, evaluateCluster(t)));
    const least = entries.reduce((a, b) => (b.perimeter !== null && b.perimeter < (a.perimeter ?? Infinity) ? b : a));
    least.index = 1;
    const c = assembleCatalogue(plan, entries);
    expect(c.entries[0].index).toBe(0);
    expect(c.entries[1]).toMatchObject({ code: least.code, index: 1, rank: 2 });
    expect(c.entries[1].gapPercent!).toBeLessThan(0);
    expect(c.counts).toMatchObject({ stable: c.counts.equilibria - 1, saddles: 1 });
    const text = writeCatalogue(c);
    expect(readCatalogue(text).entries[1].index).toBe(1);
    // the saddle ranked first, before a stable equilibrium: refused
    const data = JSON.parse(text);
    [data.entries[0], data.entries[1]] = [data.entries[1], data.entries[0]];
    data.entries[0].rank = 1;
    data.entries[1].rank = 2;
    data.entries[0].gapPercent = 0;
    data.entries[1].gapPercent = (100 * (data.entries[1].perimeter - data.entries[0].perimeter)) / data.entries[0].perimeter;
    expect(() => readCatalogue(JSON.stringify(data), 'saddle-first.json')).toThrow(/entry 2 \(rank 2, .*\): index is 0 after rank 1 of index 1 when expected rank 1 stable/);
  });

  it("a candidate's saddles come after its stable equilibria, even below them; a file with a saddle first is refused", () => {
    // the listing rule (saddles after the stable entries of the same arrangement). A saddle of
    // 4.10 at equal areas stands in here as a copy of its stable entry relabelled index 1: for the
    // ranking, a perimeter just below the stable one's; for the reader, the same certified geometry.
    const plan = planRanking([1, 1, 1, 1]);
    const entries = plan.tasks.flatMap((t, k) => unrankedEntries(plan, k, evaluateCluster(t)));
    const stable = entries.find((e) => e.id === '4.10' && e.status === 'ok')!;
    const saddle = { ...structuredClone(stable), index: 1, reached: 0, perimeter: stable.perimeter! * (1 - 1e-6) };
    const c = assembleCatalogue(plan, [...entries, saddle]);
    const at = (index: number) => c.entries.findIndex((e) => e.id === '4.10' && e.index === index);
    expect(at(0)).toBeGreaterThan(0);
    expect(at(1)).toBe(at(0) + 1);
    expect(c.entries[at(1)].gapPercent!).toBeLessThan(c.entries[at(0)].gapPercent!);
    // the reader: with the saddle's perimeter its geometry's, it reads; with the saddle first, refused
    c.entries[at(1)].perimeter = stable.perimeter;
    c.entries[at(1)].gapPercent = c.entries[at(0)].gapPercent;
    const text = writeCatalogue(c);
    expect(readCatalogue(text).entries[at(1)].index).toBe(1);
    const data = JSON.parse(text);
    const [i, j] = [at(0), at(1)];
    [data.entries[i], data.entries[j]] = [data.entries[j], data.entries[i]];
    [data.entries[i].rank, data.entries[j].rank] = [i + 1, j + 1];
    expect(() => readCatalogue(JSON.stringify(data), 'saddle-before.json')).toThrow(/index is 0 after a saddle of its candidate when expected a candidate's stable equilibria before its saddles/);
  });
});
