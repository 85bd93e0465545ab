/**
 * Self time per function of a `.cpuprofile` (from `node --cpu-prof`), largest first:
 * `node --import tsx bench/engine/profile-summary.ts <file.cpuprofile> [rows]`.
 */
import { readFileSync } from 'node:fs';

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
}
interface Profile {
  nodes: ProfileNode[];
  samples: number[];
  timeDeltas: number[];
}

const [file, rows = '20'] = process.argv.slice(2);
if (!file) throw new Error('usage: profile-summary.ts <file.cpuprofile> [rows]');
const profile = JSON.parse(readFileSync(file, 'utf8')) as Profile;
const nameOf = new Map<number, string>();
for (const n of profile.nodes) {
  const { functionName, url, lineNumber } = n.callFrame;
  const where = url ? `${url.split('/').slice(-2).join('/')}:${lineNumber + 1}` : '';
  nameOf.set(n.id, `${functionName || '(anonymous)'} ${where}`.trim());
}
const self = new Map<string, number>();
let total = 0;
profile.samples.forEach((id, i) => {
  const dt = profile.timeDeltas[i] ?? 0;
  total += dt;
  const name = nameOf.get(id) ?? '?';
  self.set(name, (self.get(name) ?? 0) + dt);
});
const top = [...self.entries()].sort((a, b) => b[1] - a[1]).slice(0, Number(rows));
for (const [name, t] of top) console.log(`${((100 * t) / total).toFixed(1).padStart(5)} %  ${name}`);
