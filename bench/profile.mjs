// Where the app server's CPU time went, from the V8 CPU profiles `node --cpu-prof` wrote (one per
// process). Prints self time by package (node_modules/<name>, the app's own build, Node itself) and
// the functions with the most self time. Also runnable alone: `node bench/profile.mjs bench/out/prof`.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

/** The package a script URL belongs to, for grouping. */
function packageOf(url) {
  if (!url) return '(native / idle / gc)';
  if (url.startsWith('node:')) return 'node';
  const modules = url.lastIndexOf('node_modules/');
  if (modules >= 0) {
    const rest = url.slice(modules + 'node_modules/'.length).split('/');
    const name = rest[0].startsWith('@') ? `${rest[0]}/${rest[1]}` : rest[0];
    // Next's own compiled copies of its dependencies are told apart from Next itself.
    const compiled = rest.indexOf('compiled');
    return name === 'next' && compiled >= 0 ? `next (compiled ${rest[compiled + 1]})` : name;
  }
  if (url.includes('/.next-bench/')) return 'app build (.next-bench)';
  return path.basename(url);
}

export function summarize(dir, { top = 25 } = {}) {
  const files = readdirSync(dir).filter((f) => f.endsWith('.cpuprofile'));
  if (files.length === 0) {
    console.log(`No CPU profile in ${dir} (the server must exit cleanly to write one).`);
    return;
  }
  const byPackage = new Map();
  const byFunction = new Map();
  let total = 0;
  for (const file of files) {
    const profile = JSON.parse(readFileSync(path.join(dir, file), 'utf8'));
    const nodes = new Map(profile.nodes.map((n) => [n.id, n]));
    // Self time of a node = the sampling intervals that ended in it.
    const self = new Map();
    profile.samples.forEach((id, i) => {
      const dt = profile.timeDeltas[i] ?? 0;
      self.set(id, (self.get(id) ?? 0) + dt);
    });
    for (const [id, us] of self) {
      const { callFrame } = nodes.get(id);
      const name = callFrame.functionName || '(anonymous)';
      if (name === '(idle)') continue;
      total += us;
      const pkg = ['(garbage collector)', '(program)'].includes(name) ? name : packageOf(callFrame.url);
      byPackage.set(pkg, (byPackage.get(pkg) ?? 0) + us);
      const key = `${name}  ${packageOf(callFrame.url)}${callFrame.url ? `:${callFrame.lineNumber + 1}` : ''}`;
      byFunction.set(key, (byFunction.get(key) ?? 0) + us);
    }
  }
  const pct = (us) => `${((100 * us) / total).toFixed(1).padStart(5)} %`;
  const ms = (us) => `${(us / 1000).toFixed(0).padStart(7)} ms`;
  console.log(`\nCPU profile of the app server (${files.length} file(s), ${(total / 1e6).toFixed(1)} s busy, idle left out)`);
  console.log('\nSelf time by package:');
  for (const [pkg, us] of [...byPackage].sort((a, b) => b[1] - a[1]).slice(0, 15)) console.log(`  ${ms(us)} ${pct(us)}  ${pkg}`);
  console.log(`\nTop ${top} functions by self time:`);
  for (const [fn, us] of [...byFunction].sort((a, b) => b[1] - a[1]).slice(0, top)) console.log(`  ${ms(us)} ${pct(us)}  ${fn}`);
}

if (import.meta.url === `file://${process.argv[1]}`) summarize(process.argv[2] ?? 'bench/out/prof');
