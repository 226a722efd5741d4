import { describe, expect, it } from 'vitest';
import { pcmArgs } from '../../../electron/host/audio/decode-types.ts';
import { soundArgs, SOUND_RATE } from '../../../renderer/src/candidates/sound-args.ts';
import { SCAN_SAMPLE_RATE } from '../../../electron/host/audio/scan-footage.ts';

describe('the app worker decodes what the host decodes', () => {
  it('sound: same ffmpeg arguments and rate as the host’s whistle scan', () => {
    expect(SOUND_RATE).toBe(SCAN_SAMPLE_RATE);
    expect(soundArgs('{input}', '{output}')).toEqual(pcmArgs('{input}', SCAN_SAMPLE_RATE, '{output}'));
  });
});
