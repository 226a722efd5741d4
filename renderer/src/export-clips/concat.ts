/**
 * The whole reel as one MP4: the clips exported by the embedded path are joined packet by
 * packet (no second encode), each clip's timestamps shifted to follow the one before.
 * Every clip came from the same encoder settings, so they share one decoder configuration;
 * if they did not, joining would give a file players choke on, so it is refused instead.
 *
 *   const reel = await joinClips([clip1Bytes, clip2Bytes]);   // -> Uint8Array (MP4)
 */
import { ALL_FORMATS, BufferSource, BufferTarget, EncodedAudioPacketSource, EncodedPacketSink, EncodedVideoPacketSource, Input, Mp4OutputFormat, Output, type AudioCodec } from 'mediabunny';

function sameConfig(a: VideoDecoderConfig | AudioDecoderConfig | null, b: VideoDecoderConfig | AudioDecoderConfig | null): boolean {
  if (!a || !b) return a === b;
  const bytes = (d: unknown) => (d instanceof ArrayBuffer ? new Uint8Array(d) : ArrayBuffer.isView(d) ? new Uint8Array(d.buffer, d.byteOffset, d.byteLength) : new Uint8Array(0));
  const da = bytes(a.description);
  const db = bytes(b.description);
  return a.codec === b.codec && da.length === db.length && da.every((v, i) => v === db[i]);
}

export async function joinClips(clips: Uint8Array[]): Promise<Uint8Array> {
  if (!clips.length) throw new Error('a reel file needs at least one clip');
  const target = new BufferTarget();
  const output = new Output({ format: new Mp4OutputFormat({ fastStart: 'in-memory' }), target });
  const inputs = clips.map((c) => new Input({ source: new BufferSource(c), formats: ALL_FORMATS }));
  const firstV = await inputs[0].getPrimaryVideoTrack();
  const firstA = await inputs[0].getPrimaryAudioTrack();
  if (!firstV) throw new Error('the first clip has no video');
  const vConfig = await firstV.getDecoderConfig();
  const aConfig = firstA ? await firstA.getDecoderConfig() : null;
  const vSource = new EncodedVideoPacketSource('avc');
  output.addVideoTrack(vSource, { frameRate: 25 });
  const aSource = firstA?.codec ? new EncodedAudioPacketSource(firstA.codec as AudioCodec) : undefined;
  if (aSource) output.addAudioTrack(aSource);
  await output.start();
  let offset = 0;
  let firstVideo = true;
  let firstAudio = true;
  for (let i = 0; i < inputs.length; i++) {
    const v = await inputs[i].getPrimaryVideoTrack();
    const a = await inputs[i].getPrimaryAudioTrack();
    if (!v || !sameConfig(vConfig, await v.getDecoderConfig())) throw new Error(`clip ${i + 1} was encoded differently from clip 1; the reel file is left out (the clip files are complete)`);
    if (aSource && (!a || !sameConfig(aConfig, await a.getDecoderConfig()))) throw new Error(`clip ${i + 1} has other audio than clip 1; the reel file is left out (the clip files are complete)`);
    // Each clip starts at its own first presented frame; the next one follows its last
    // frame plus one frame interval (the clips' own timestamps may not start at 0).
    const packets: import('mediabunny').EncodedPacket[] = [];
    for await (const p of new EncodedPacketSink(v).packets()) packets.push(p);
    const times = packets.map((p) => p.timestamp).sort((x, y) => x - y);
    const start = times[0] ?? 0;
    const steps = times.slice(1).map((t, k) => t - times[k]).sort((x, y) => x - y);
    const step = steps[steps.length >> 1] ?? 1 / 25;
    const end = (times[times.length - 1] ?? 0) - start + step;
    for (const p of packets) {
      await vSource.add(p.clone({ timestamp: offset + p.timestamp - start, duration: step }), firstVideo ? { decoderConfig: vConfig! } : undefined);
      firstVideo = false;
    }
    if (aSource && a) {
      for await (const p of new EncodedPacketSink(a).packets()) {
        const t = p.timestamp - start;
        if (t < 0) continue;
        if (t >= end) break; // audio never runs past its clip's picture
        await aSource.add(p.clone({ timestamp: offset + t }), firstAudio ? { decoderConfig: aConfig! } : undefined);
        firstAudio = false;
      }
    }
    offset += end;
  }
  await output.finalize();
  inputs.forEach((inp) => inp.dispose?.());
  return new Uint8Array(target.buffer!);
}
