// Minimal types for the cross-check library (it ships none); only what the tests use.
declare module 'smpte-timecode' {
  interface SmpteTimecode {
    frameCount: number;
    hours: number;
    minutes: number;
    seconds: number;
    frames: number;
    dropFrame: boolean;
    toString(): string;
  }
  function Timecode(timeCode: number | string, frameRate?: number | [number, number], dropFrame?: boolean): SmpteTimecode;
  export default Timecode;
}
