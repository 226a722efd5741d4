import { describe, expect, it } from 'vitest';
import { DEFAULT_TEAMS } from '../../../renderer/src/overlay/style.ts';
import { deltaE76, rgbOf, simulate } from './colour-vision.ts';

describe('default team colours under colour-vision deficiency', () => {
  it('stay far apart under deuteranopia and protanopia (Machado et al. 2009, ΔE*ab CIE 1976)', () => {
    const home = rgbOf(DEFAULT_TEAMS.home.colour);
    const away = rgbOf(DEFAULT_TEAMS.away.colour);
    const normal = deltaE76(home, away);
    const deut = deltaE76(simulate(home, 'deuteranopia'), simulate(away, 'deuteranopia'));
    const prot = deltaE76(simulate(home, 'protanopia'), simulate(away, 'protanopia'));
    console.log(`home/away ΔE*ab: normal ${normal.toFixed(1)}, deuteranopia ${deut.toFixed(1)}, protanopia ${prot.toFixed(1)}`);
    // A ΔE*ab of about 2.3 is a just-noticeable difference (Sharma 2003, from memory); markers need far more.
    expect(deut).toBeGreaterThan(40);
    expect(prot).toBeGreaterThan(40);
  });

  it('a red/green pair, for contrast, collapses under deuteranopia (the simulation is not a no-op)', () => {
    const red = rgbOf(0xd62728);
    const green = rgbOf(0x2ca02c);
    const normal = deltaE76(red, green);
    const deut = deltaE76(simulate(red, 'deuteranopia'), simulate(green, 'deuteranopia'));
    console.log(`red/green ΔE*ab: normal ${normal.toFixed(1)}, deuteranopia ${deut.toFixed(1)}`);
    expect(deut).toBeLessThan(normal / 3);
  });
});
