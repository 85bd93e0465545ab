/**
 * Solves per CPU second of single-plane and two-plane balancing in a bare loop (no benchmark harness around each
 * call), in interleaved rounds so that both see the same machine:
 *   node --import tsx bench/engine/solve-loop.ts [rounds] [seconds per method per round] [both|single|two]
 * For a CPU profile of one method: node --cpu-prof --cpu-prof-dir <dir> --import tsx bench/engine/solve-loop.ts 1 5 two
 * then `node --import tsx bench/engine/profile-summary.ts <dir>/<largest file>`.
 */
import { multiPlaneBalance, singlePlaneBalance } from '@counterpoise/engine';
import { singlePlane, twoPlane } from './engine-inputs';

const rounds = Number(process.argv[2] ?? 5);
const seconds = Number(process.argv[3] ?? 1);
const which = process.argv[4] ?? 'both';

const methods = {
  single: () => singlePlaneBalance(singlePlane).totalCorrection.mass,
  two: () => multiPlaneBalance(twoPlane).corrections[0]!.mass,
};

/**
 * Solves per second of CPU time used by this process (user + system, GC threads included): on a shared machine
 * the time other processes take the core is not counted, as it would be in wall-clock time.
 */
function perSecond(solve: () => number): number {
  const start = process.cpuUsage();
  const budget = seconds * 1e6;
  let used = 0;
  let solves = 0;
  let sink = 0;
  while (used < budget) {
    for (let i = 0; i < 1000; i++) sink += solve();
    solves += 1000;
    const now = process.cpuUsage(start);
    used = now.user + now.system;
  }
  if (!(sink > 0)) throw new Error('a solve gave no mass');
  return (solves * 1e6) / used;
}

const names = which === 'both' ? (['single', 'two'] as const) : ([which as 'single' | 'two'] as const);
const results: Record<string, number[]> = { single: [], two: [] };
for (let round = 0; round < rounds; round++) {
  for (const name of names) results[name]!.push(perSecond(methods[name]));
}
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const fmt = (x: number) => Math.round(x).toLocaleString('en-GB');
for (const name of names) {
  console.log(
    `${name === 'single' ? 'single-plane' : 'two-plane   '} median ${fmt(median(results[name]!))}/s  rounds ${results[name]!.map(fmt).join(' / ')}`,
  );
}
if (names.length === 2) {
  const ratios = results['two']!.map((t, i) => t / results['single']![i]!);
  console.log(
    `two-plane / single-plane: median ${median(ratios).toFixed(2)}  rounds ${ratios.map((r) => r.toFixed(2)).join(' / ')}`,
  );
}
