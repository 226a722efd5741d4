/**
 * Finding columns by their header names. Names are compared in a loose form (lower case,
 * letters and digits only), so "Frame No", "frame_no" and "frameNo" all match.
 */
export const looseName = (s: string): string => s.toLowerCase().replace(/[^a-z0-9]/g, '');

export const COLUMN_NAMES = {
  frame: ['frame', 'frameid', 'frameno', 'framenumber', 'framenum', 'fid', 'f', 'frameidx', 'frameindex'],
  time: ['times', 'time', 't', 'timestamp', 'seconds', 'secs', 'sec', 'timesec', 'elapsed', 'elapseds', 'ts', 'timems'],
  period: ['period', 'half', 'periodid', 'phase', 'periodno', 'part', 'segment'],
  object: ['object', 'objectid', 'id', 'trackid', 'obj', 'entity', 'entityid', 'target', 'playerid'],
  team: ['team', 'side', 'teamid', 'teamname', 'club'],
  shirt: ['shirt', 'jersey', 'shirtnumber', 'jerseynumber', 'number', 'no', 'num', 'shirtno'],
  player: ['player', 'playerid', 'playername', 'shirt', 'shirtno', 'shirtnumber', 'jersey', 'number', 'who', 'actor'],
  x: ['x', 'posx', 'xm', 'px', 'xpos', 'locx', 'startx', 'xcoord', 'xcm'],
  y: ['y', 'posy', 'ym', 'py', 'ypos', 'locy', 'starty', 'ycoord', 'ycm'],
  z: ['z', 'posz', 'zm', 'pz', 'height', 'zpos', 'ballz'],
  endX: ['endx', 'tox', 'x2', 'destx', 'targetx'],
  endY: ['endy', 'toy', 'y2', 'desty', 'targety'],
  kind: ['event', 'kind', 'type', 'eventtype', 'action', 'eventname', 'what', 'eventkind', 'name'],
  clock: ['clock', 'time', 'matchclock', 'gameclock', 'minute', 'timestamp', 'eventtime', 'matchtime', 'ts', 'when', 'timeiso', 'wallclock', 'times', 't', 'seconds', 'secs'],
} as const;

/** The first header name matching any of the synonyms (in synonym order), or undefined. */
export function findColumn(header: string[], synonyms: readonly string[], exclude: string[] = []): string | undefined {
  const loose = header.map(looseName);
  for (const s of synonyms) {
    const i = loose.indexOf(s);
    if (i !== -1 && !exclude.includes(header[i])) return header[i];
  }
  return undefined;
}
