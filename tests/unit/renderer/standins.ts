/**
 * Small invented stand-in files (until and beside fixtures/demo): a wide tracking CSV and
 * an event log, made by formula so tests can check what the import must give back.
 */
export const STANDIN_TEAMS = { home: 'Harbour Town', away: 'Moor Rovers' };

/** Wide layout, 25 Hz, period column, 2 home + 2 away players and the ball, centre metres. */
export function standinTrackingCsv(secondsPerPeriod = 8): string {
  const ids = ['home_1', 'home_2', 'away_1', 'away_2', 'ball'];
  const header = ['period', 'frame', 'time_s', ...ids.flatMap((id) => [`${id}_x`, `${id}_y`])];
  const lines = [header.join(',')];
  let frame = 1000;
  for (const period of [1, 2]) {
    for (let i = 0; i < secondsPerPeriod * 25; i++, frame++) {
      const t = i / 25;
      const row = [String(period), String(frame), t.toFixed(2)];
      ids.forEach((_, o) => row.push((o * 5 - 10 + t * 0.5).toFixed(2), (o * 3 - 6 - t * 0.25).toFixed(2)));
      lines.push(row.join(','));
    }
    frame += 25 * 60;
  }
  return lines.join('\n') + '\n';
}

export function standinEventsCsv(): string {
  const rows = [
    ['1', '00:00.0', 'Kick Off', STANDIN_TEAMS.home, '9', '0', '0'],
    ['1', '00:02.4', 'Pass', STANDIN_TEAMS.home, '9', '-3', '1'],
    ['1', '00:05.1', 'Goal Kick', STANDIN_TEAMS.away, '1', '47', '-2'],
    ['2', '45:00.0', 'Kick Off', STANDIN_TEAMS.away, '10', '0', '0'],
    ['2', '45:03.9', 'Throw In', STANDIN_TEAMS.home, '3', '12', '34'],
    ['2', '45:06.2', 'Corner', STANDIN_TEAMS.away, '7', '52.5', '34'],
  ];
  return ['period,clock,event,team,player,x,y', ...rows.map((r) => r.join(','))].join('\n') + '\n';
}
