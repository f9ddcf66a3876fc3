// Reads a V8 CPU profile (node --cpu-prof) and prints where the time went: self time grouped by
// package or project file, and the project's own functions. Usage: tsx tests/bench/profile-summary.ts FILE [N]
import { readFileSync } from 'node:fs';

interface Node {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
  children?: number[];
}
interface Profile {
  nodes: Node[];
  samples: number[];
  timeDeltas: number[];
  startTime: number;
  endTime: number;
}

const [file, topArg] = process.argv.slice(2);
if (!file) throw new Error('usage: profile-summary.ts FILE.cpuprofile [N]');
const top = Number(topArg ?? 25);
const profile = JSON.parse(readFileSync(file, 'utf8')) as Profile;
const byId = new Map(profile.nodes.map((n) => [n.id, n]));

// Self time per node, from the sample intervals.
const self = new Map<number, number>();
profile.samples.forEach((id, i) => self.set(id, (self.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0)));
const totalUs = profile.endTime - profile.startTime;

/** A package name for node_modules files, the project path for ours, else V8's label. */
function groupOf(n: Node) {
  const { url, functionName } = n.callFrame;
  if (!url) return `(${functionName || 'native'})`;
  const pkg = /node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(url);
  if (pkg) return pkg[1]!;
  if (url.startsWith('node:')) return url;
  const own = /\/(server|shared|tests)\/(.*)$/.exec(url);
  return own ? `${own[1]}/${own[2]}` : url;
}

const add = (m: Map<string, number>, k: string, v: number) => m.set(k, (m.get(k) ?? 0) + v);
const groups = new Map<string, number>();
const functions = new Map<string, number>();
for (const [id, us] of self) {
  const n = byId.get(id)!;
  if (n.callFrame.functionName === '(idle)') continue;
  const g = groupOf(n);
  add(groups, g, us);
  if (/^(server|shared)\//.test(g))
    add(functions, `${n.callFrame.functionName || '(anonymous)'} ${g}:${n.callFrame.lineNumber + 1}`, us);
}
const busyUs = [...groups.values()].reduce((s, us) => s + us, 0);
const print = (title: string, m: Map<string, number>) => {
  console.log(`\n${title}`);
  for (const [k, us] of [...m].sort((a, b) => b[1] - a[1]).slice(0, top))
    console.log(
      `  ${((100 * us) / busyUs).toFixed(1).padStart(5)} %  ${(us / 1000).toFixed(0).padStart(7)} ms  ${k}`,
    );
};
console.log(
  `${file}: ${(totalUs / 1e6).toFixed(1)} s profiled, ${(busyUs / 1e6).toFixed(2)} s busy (self time; % of busy)`,
);
print('By package or file', groups);
print('Project functions', functions);
