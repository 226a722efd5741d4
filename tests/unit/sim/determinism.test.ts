import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEMO_EVENTS, DEMO_FILES, DEMO_FOOTAGE, DEMO_SIM, DEMO_TRACKING } from '../../../fixtures/sim/demo-config.ts';
import { homographyText, planFootage } from '../../../fixtures/sim/footage/plan.ts';
import { simulateMatch } from '../../../fixtures/sim/simulate.ts';
import { writeTracking } from '../../../fixtures/sim/tracking-writer.ts';
import { makeDataSet, truthOf, truthText } from '../../../fixtures/sim/write-data.ts';

const demoDir = new URL('../../../fixtures/demo/', import.meta.url).pathname;
const sha = (s: string | Buffer) => createHash('sha256').update(s).digest('hex');

describe('determinism', () => {
  it('same seed gives the same output; another seed does not', () => {
    const opts = { seed: 77, periodSeconds: [40, 40], preRollS: [5, 5] };
    const a = writeTracking(simulateMatch(opts)).text;
    const b = writeTracking(simulateMatch(opts)).text;
    const c = writeTracking(simulateMatch({ ...opts, seed: 78 })).text;
    expect(sha(a)).toBe(sha(b));
    expect(sha(a)).not.toBe(sha(c));
  });

  it('regenerating the demo data gives files byte-identical to the committed ones', () => {
    const ds = makeDataSet(DEMO_SIM, DEMO_TRACKING, DEMO_EVENTS);
    const plan = planFootage(ds.world, DEMO_FOOTAGE);
    const truth = truthOf(ds, {
      clock: plan.clock, whistles: plan.whistles, nonLive: plan.nonLive,
      info: {
        file: DEMO_FILES.footage, width: DEMO_FOOTAGE.width, height: DEMO_FOOTAGE.height, fps: DEMO_FOOTAGE.fps,
        frameCount: plan.timeline.frameCount, durationS: plan.timeline.durationS, homographyFile: DEMO_FILES.homography,
      },
    });
    const committed = (name: string) => sha(readFileSync(join(demoDir, name)));
    expect(sha(ds.tracking.text), DEMO_FILES.tracking).toBe(committed(DEMO_FILES.tracking));
    expect(sha(ds.events.text), DEMO_FILES.events).toBe(committed(DEMO_FILES.events));
    expect(sha(truthText(truth)), DEMO_FILES.truth).toBe(committed(DEMO_FILES.truth));
    expect(sha(homographyText(plan)), DEMO_FILES.homography).toBe(committed(DEMO_FILES.homography));
  });

  it('the committed tracking stays within the size budget (<= 4 MB) and is 25 Hz wide metres', () => {
    const text = readFileSync(join(demoDir, DEMO_FILES.tracking), 'utf8');
    expect(text.length).toBeLessThanOrEqual(4 * 1024 * 1024);
    const [head, r1, r2] = text.split('\n');
    expect(head.startsWith('period,frame,time_s,ball_x,ball_y,ball_z,home_1_x')).toBe(true);
    expect(Number(r2.split(',')[2]) - Number(r1.split(',')[2])).toBeCloseTo(0.04, 9);
  });
});
