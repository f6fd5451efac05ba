// Self and total time by function in a V8 .cpuprofile (from PROFILE= in bench/sectionLatency.ts).
// Usage: node bench/profileTop.mjs file.cpuprofile [rows]
import { readFileSync } from 'node:fs';

const [file, rows = '40'] = process.argv.slice(2);
const p = JSON.parse(readFileSync(file, 'utf8'));
const byId = new Map(p.nodes.map((n) => [n.id, n]));
const parent = new Map();
for (const n of p.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
const hits = new Map();
p.samples.forEach((id, i) => hits.set(id, (hits.get(id) ?? 0) + (p.timeDeltas[i] ?? 0)));
const total = [...hits.values()].reduce((a, b) => a + b, 0);
const name = (n) => `${n.callFrame.functionName || '(anon)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber + 1}`;
const self = new Map();
const incl = new Map();
for (const [id, us] of hits) {
  const n = byId.get(id);
  self.set(name(n), (self.get(name(n)) ?? 0) + us);
  const seen = new Set();
  for (let x = id; x !== undefined; x = parent.get(x)) {
    const k = name(byId.get(x));
    if (seen.has(k)) continue;
    seen.add(k);
    incl.set(k, (incl.get(k) ?? 0) + us);
  }
}
const show = (m, title) => {
  console.log(`${title} (of ${(total / 1000).toFixed(0)} ms)`);
  for (const [k, us] of [...m].sort((a, b) => b[1] - a[1]).slice(0, Number(rows)))
    console.log(`${(us / 1000).toFixed(0).padStart(7)} ms ${((100 * us) / total).toFixed(1).padStart(5)} %  ${k}`);
};
show(self, 'self');
show(incl, 'total');
