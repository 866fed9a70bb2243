const [A, B] = [process.argv[2], process.argv[3]];
const n = Number(process.env.N ?? 10);
const stride = n === 10 ? 401 : n === 8 ? 37 : 1;
const count = n === 10 ? 150 : n === 8 ? 300 : 263;
const load = async (root: string) => ({
  relax: (await import(`${root}/src/solver/newton.ts`)).relax,
  enumerateClusters: (await import(`${root}/src/maps/cluster.ts`)).enumerateClusters,
});
const a = await load(A); const b = await load(B);
const maps = (lib: any) => { const out: any[] = []; let i = 0; for (const c of lib.enumerateClusters(n)) { if (i++ % stride === 0) out.push(c.map); if (out.length === count) break; } return out; };
const ma = maps(a); const mb = maps(b);
const run = (lib: any, ms: any[]) => { let s = 0; for (const m of ms) s += lib.relax(m, new Float64Array(n).fill(1)).perimeter; return s; };
run(a, ma); run(b, mb); run(a, ma); run(b, mb);
const ta: number[] = []; const tb: number[] = [];
for (let r = 0; r < Number(process.env.REPS ?? 8); r++) {
  let t = process.cpuUsage(); run(a, ma); let u = process.cpuUsage(t); ta.push((u.user + u.system) / 1000);
  t = process.cpuUsage(); run(b, mb); u = process.cpuUsage(t); tb.push((u.user + u.system) / 1000);
}
const med = (x: number[]) => [...x].sort((p, q) => p - q)[x.length >> 1];
console.log(`n=${n} A ${A}: min ${Math.min(...ta).toFixed(0)} med ${med(ta).toFixed(0)} | B ${B}: min ${Math.min(...tb).toFixed(0)} med ${med(tb).toFixed(0)} ms`);
