/**
 * Summaries for the Sources screen, computed once from the imported data.
 */
import type { EventKind, EventLog, FootageProbe, TrackingData } from '../../shared-types/index.ts';
import type { PeriodSummary, SourceSummary } from './db/rows.ts';

export function summariseTracking(data: TrackingData, rows?: number, rejectedRows?: number): SourceSummary {
  const players = { home: 0, away: 0, unknown: 0 };
  for (const o of data.objects) {
    if (o.role !== 'player') continue;
    players[o.team ?? 'unknown']++;
  }
  const periods: PeriodSummary[] = data.periods.map((p) => {
    let present = 0;
    for (let i = 0; i < p.present.length; i++) present += p.present[i];
    return {
      period: p.period,
      start: 0,
      end: p.frameCount / data.rate,
      frames: p.frameCount,
      missingFrames: p.frameCount - present,
      homeAttacks: p.homeAttacks,
    };
  });
  const frames = data.periods.reduce((s, p) => s + p.frameCount, 0);
  return {
    duration: periods.reduce((s, p) => s + (p.end - p.start), 0),
    rate: data.rate,
    frames,
    objects: data.objects.length,
    players,
    hasBall: data.ballIndex >= 0,
    periods,
    ...(rows !== undefined ? { rows } : {}),
    ...(rejectedRows !== undefined ? { rejectedRows } : {}),
  };
}

export function summariseEvents(log: EventLog, rows?: number, rejectedRows?: number): SourceSummary {
  const eventsByKind: Partial<Record<EventKind, number>> = {};
  const byPeriod = new Map<number, { start: number; end: number; events: number }>();
  for (const e of log.events) {
    eventsByKind[e.kind] = (eventsByKind[e.kind] ?? 0) + 1;
    const p = byPeriod.get(e.period);
    if (!p) byPeriod.set(e.period, { start: e.t, end: e.t, events: 1 });
    else {
      p.start = Math.min(p.start, e.t);
      p.end = Math.max(p.end, e.t);
      p.events++;
    }
  }
  const periods: PeriodSummary[] = [...byPeriod.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([period, p]) => ({ period, start: p.start, end: p.end, events: p.events }));
  return {
    duration: periods.reduce((s, p) => s + (p.end - p.start), 0),
    eventCount: log.events.length,
    eventsByKind,
    teams: log.teams,
    periods,
    ...(rows !== undefined ? { rows } : {}),
    ...(rejectedRows !== undefined ? { rejectedRows } : {}),
  };
}

export function summariseFootage(probe: FootageProbe): SourceSummary {
  return {
    duration: probe.duration,
    rate: probe.measuredFps || probe.nominalFps,
    frames: probe.frameCount,
    periods: [],
    footage: {
      container: probe.container,
      videoCodec: probe.videoCodec,
      ...(probe.audioCodec ? { audioCodec: probe.audioCodec } : {}),
      width: probe.width,
      height: probe.height,
      nominalFps: probe.nominalFps,
      measuredFps: probe.measuredFps,
      variableRate: probe.variableRate,
      frameCount: probe.frameCount,
      startTime: probe.startTime,
    },
  };
}

/** 5423.2 -> "1:30:23"; 83.4 -> "1:23.4" */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return '–';
  const neg = seconds < 0;
  let s = Math.abs(seconds);
  const h = Math.floor(s / 3600);
  s -= h * 3600;
  const m = Math.floor(s / 60);
  s -= m * 60;
  const ss = h > 0 ? Math.floor(s).toString().padStart(2, '0') : s.toFixed(1).padStart(4, '0');
  const body = h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
  return (neg ? '-' : '') + body;
}

/** 1536 -> "1.5 KB" (binary multiples, as file managers usually show). */
export function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  const units = ['KB', 'MB', 'GB'];
  let v = n / 1024;
  let i = 0;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return `${v.toFixed(v < 10 ? 1 : 0)} ${units[i]}`;
}
