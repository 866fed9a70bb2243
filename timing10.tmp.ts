import { enumerateClusters } from './src/maps/cluster.ts';
import { relax } from './src/solver/newton.ts';
const maps: any[] = []; let i = 0;
for (const c of enumerateClusters(10)) { if (i++ % 401 === 0) maps.push(c.map); if (maps.length === 150) break; }
const run = () => { let s = 0; for (const m of maps) s += relax(m, new Float64Array(10).fill(1)).perimeter; return s; };
run();
const times: number[] = [];
for (let r = 0; r < (Number(process.env.REPS) || 5); r++) { const t = process.cpuUsage(); run(); const u = process.cpuUsage(t); times.push((u.user + u.system) / 1000); }
console.log(process.argv[2] ?? '', 'n=10 cpu min', Math.min(...times).toFixed(0), 'ms median', times.sort((a, b) => a - b)[2].toFixed(0));
