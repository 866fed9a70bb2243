import { enumerateClusters } from './src/maps/cluster.ts';
import { relax } from './src/solver/newton.ts';
const maps: any[] = []; let i = 0;
for (const c of enumerateClusters(8)) { if (i++ % 37 === 0) maps.push(c.map); if (maps.length === 300) break; }
for (let r = 0; r < 12; r++) for (const m of maps) relax(m, new Float64Array(8).fill(1));
