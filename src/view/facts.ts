// view stage: what the viewer knows of each catalogue entry besides its fields: a unique key, lenses,
// 3-connectivity, the range of side counts, and the T1 neighbour (through the collapsing wall of a
// failure, or the shortest wall of an equilibrium).

import { clusterFromCode, type Cluster } from '../maps/cluster.ts';
import { junctionOf } from '../maps/cubic-map.ts';
import { wallSwapCode } from '../maps/t1.ts';
import { arcLength } from '../arcs/arc.ts';
import type { CatalogueEntry } from '../catalogue/types.ts';
import type { EntryFacts } from './query.ts';

/** The shortest wall of a drawing (arc lengths), by wall index; null for the circle. */
export function shortestWallOf(cluster: Cluster, coords: readonly number[], bulges: readonly number[]): number | null {
  const { twins } = cluster.map;
  let best = -1;
  let bestLength = Infinity;
  let k = 0;
  for (let e = 0; e < twins.length; e++) {
    if (e > twins[e]) continue;
    const a = junctionOf(e);
    const b = junctionOf(twins[e]);
    const length = arcLength(coords[2 * a], coords[2 * a + 1], coords[2 * b], coords[2 * b + 1], bulges[k]);
    if (length < bestLength) {
      bestLength = length;
      best = k;
    }
    k++;
  }
  return best === -1 ? null : best;
}

/**
 * The facts of every entry of a catalogue, in its order. Keys are ids, with the assignment where an id
 * repeats, and the rank where a candidate has several equilibria (a candidate's failure is its only entry).
 */
export function entryFacts(entries: readonly CatalogueEntry[]): EntryFacts[] {
  const seen = new Map<string, number>();
  const count = (name: string): void => void seen.set(name, (seen.get(name) ?? 0) + 1);
  for (const e of entries) {
    count(e.id || e.code);
    count(`${e.id || e.code}/${e.assignment.join('.')}`);
  }
  const clusters = new Map<string, Cluster>();
  return entries.map((entry) => {
    let cluster = clusters.get(entry.code);
    if (cluster === undefined) {
      cluster = clusterFromCode(entry.code);
      clusters.set(entry.code, cluster);
    }
    const name = entry.id || entry.code;
    const candidate = `${name}/${entry.assignment.join('.')}`;
    const key = seen.get(name) === 1 ? name : seen.get(candidate) === 1 ? candidate : `${candidate}/${entry.rank}`;
    const shortestWall = entry.geometry === null ? null : shortestWallOf(cluster, entry.geometry.coords, entry.geometry.bulges);
    let t1: string | null = entry.becomes?.code ?? null;
    if (shortestWall !== null) t1 = wallSwapCode(cluster, shortestWall);
    return {
      key,
      lens: entry.sides.includes(2),
      threeConnected: cluster.threeConnected,
      minSides: Math.min(...entry.sides),
      maxSides: Math.max(...entry.sides),
      t1,
      shortestWall,
    };
  });
}
