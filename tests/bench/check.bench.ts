/**
 * Timing of the pin-to-pin check on generated adapters of growing size.
 *
 * Run directly: node --import tsx tests/bench/check.bench.ts
 */
import { pathToFileURL } from 'node:url';
import { performance } from 'node:perf_hooks';
import { checkAdapter } from '../../shared/check';

/** Target from the design: a 1 000-circuit adapter checks in under this many ms. */
export const TARGET_MS_AT_1000 = 5;

const SIZES = ['22 AWG', '20 AWG', '18 AWG', '16 AWG', '0.5 mm²', '0.75 mm2', '1 mm2'];
const COLORS = ['RD', 'BK', 'GN/YE', 'WH/BU', 'violet', 'BN', 'YE/BK', 'OG'];
const ROLES = ['5 V reference', 'signal', 'low reference', 'ground', 'motor +', 'motor −'];

/**
 * A plausible adapter of `n` circuits: every fifth circuit a two-way splice on end A,
 * one in twenty leaving through a termination, roles on both ends, sizes, colours,
 * lengths and currents on every row, and a few spare cavities on end A.
 */
export function generateAdapter(n: number): unknown {
  const cavitiesA = n + Math.ceil(n / 5) + 4;
  const cavitiesB = n;
  const rolesA: Record<string, string> = {};
  const rolesB: Record<string, string> = {};
  const circuits: unknown[] = [];
  let nextA = 1;
  for (let i = 0; i < n; i++) {
    const role = ROLES[i % ROLES.length];
    const a = [String(nextA++)];
    if (i % 5 === 0) a.push(String(nextA++));
    const terminated = i % 20 === 19;
    const b = terminated ? [] : [String(i + 1)];
    rolesA[a[0]] = role;
    if (!terminated) rolesB[b[0]] = role;
    circuits.push({
      id: `c${i}`,
      a,
      b,
      role,
      size: SIZES[i % SIZES.length],
      color: COLORS[i % COLORS.length],
      lengthMm: 300 + (i % 7) * 100,
      currentA: (i % 4) * 0.5,
      ...(terminated ? { termination: 'ring terminal to chassis ground' } : {}),
      note: i % 3 === 0 ? 'route along the existing loom' : undefined,
    });
  }
  return {
    systemVoltage: 12,
    ends: {
      A: {
        label: `${cavitiesA}-cavity module plug`,
        cavities: Array.from({ length: cavitiesA }, (_, k) => String(k + 1)),
        sealed: true,
        roles: rolesA,
        wireSize: { min: '22 AWG', max: '16 AWG' },
      },
      B: {
        label: `${cavitiesB}-cavity harness plug`,
        cavityCount: cavitiesB,
        sealed: false,
        roles: rolesB,
      },
    },
    circuits,
  };
}

export interface BenchRow {
  circuits: number;
  /** Median time of one check, ms. */
  medianMs: number;
  /** medianMs divided by that of the row ten times smaller, when there is one. */
  growth?: number;
  samples: number;
}

export interface BenchResult {
  rows: BenchRow[];
  targetMs: number;
  /** Median at 1 000 circuits. */
  at1000Ms: number;
  pass: boolean;
}

function median(values: number[]): number {
  const s = [...values].sort((x, y) => x - y);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}

/**
 * Times checkAdapter on adapters of 10, 100, 1 000 and 10 000 circuits. Each sample
 * batches enough calls to last about 2 ms so the timer's resolution does not dominate.
 */
export function runCheckBench(
  options: { sizes?: number[]; samples?: number; log?: (line: string) => void } = {},
): BenchResult {
  const sizes = options.sizes ?? [10, 100, 1000, 10_000];
  const samples = options.samples ?? 31;
  const log = options.log ?? ((line: string) => console.log(line));
  const rows: BenchRow[] = [];
  let sink = 0;

  for (const n of sizes) {
    const input = generateAdapter(n);
    const warmUntil = performance.now() + 200;
    let calls = 0;
    while (performance.now() < warmUntil || calls < 5) {
      sink += checkAdapter(input).warnings.length;
      calls++;
    }
    const perCall = 200 / calls;
    const batch = Math.max(1, Math.ceil(2 / perCall));
    const times: number[] = [];
    for (let s = 0; s < samples; s++) {
      const t0 = performance.now();
      for (let k = 0; k < batch; k++) sink += checkAdapter(input).errors.length;
      times.push((performance.now() - t0) / batch);
    }
    const medianMs = median(times);
    const previous = rows.find((r) => r.circuits * 10 === n);
    rows.push({
      circuits: n,
      medianMs,
      samples,
      growth: previous ? medianMs / previous.medianMs : undefined,
    });
  }

  const at1000 = rows.find((r) => r.circuits === 1000)?.medianMs ?? Number.NaN;
  const pass = at1000 < TARGET_MS_AT_1000;

  log('pin-to-pin check: median time per checkAdapter call');
  log('circuits   ms/check   growth per x10');
  for (const r of rows) {
    log(
      `${String(r.circuits).padStart(8)}   ${r.medianMs.toFixed(4).padStart(8)}   ${
        r.growth === undefined ? '       -' : r.growth.toFixed(2).padStart(8)
      }`,
    );
  }
  log(
    `${pass ? 'PASS' : 'FAIL'}: 1 000 circuits in ${at1000.toFixed(3)} ms (target < ${TARGET_MS_AT_1000} ms)`,
  );
  if (sink === -1) log('');
  return { rows, targetMs: TARGET_MS_AT_1000, at1000Ms: at1000, pass };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const result = runCheckBench();
  process.exitCode = result.pass ? 0 : 1;
}
