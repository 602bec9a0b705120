import { describe, expect, it } from 'vitest';
import { runCrashTrials } from '../helpers/crash';

// `npm test` runs a short version; `npm run test:crash` runs CRASH_KILLS=100.
const kills = Number(process.env.CRASH_KILLS ?? 10);

describe('a server killed with SIGKILL while members write', () => {
  it(
    `keeps the database intact and every acknowledged write whole, over ${kills} kills`,
    async () => {
      const report = await runCrashTrials(
        kills,
        (line) => process.env.CRASH_VERBOSE && console.log(line),
      );
      console.log(
        `crash test: ${report.kills} kills, ${report.acknowledged} acknowledged writes, ${report.problems.length} problems`,
      );
      expect(report.problems).toEqual([]);
      expect(report.acknowledged).toBeGreaterThan(kills);
    },
    kills * 20_000 + 60_000,
  );
});
