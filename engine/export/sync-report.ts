/**
 * The sync report: one self-contained HTML page (inline CSS and SVG, no script, nothing
 * fetched) that prints cleanly to PDF (@media print: A4, no backgrounds needed, charts kept
 * whole). It shows each period's clock fit, a residual chart per segment, counts of
 * corrections by kind, status and size, the non-live footage intervals, and the
 * data-protection caution.
 *
 *   syncReportHtml({ title, generatedAt, user, fits, events, nonLive }) → '<!doctype html>…'
 */
import type { LabelledFit } from './clock-fits.ts';
import type { CorrectedEventRow } from './corrected-events.ts';
import type { ClockSegment } from '../../shared-types/domain.ts';

export interface NonLiveItem {
  footage: string;
  fromT: number;
  toT: number;
  kind: string;
  status: string;
  note?: string;
}

export interface SyncReportInput {
  title: string;
  generatedAt: string;
  user: string;
  appVersion?: string;
  fits: LabelledFit[];
  events: CorrectedEventRow[];
  nonLive: NonLiveItem[];
}

export const DATA_PROTECTION_CAUTION =
  'Tracking data and footage of players are personal data. This report was made on the analyst’s own machine and nothing was uploaded. ' +
  'Share it only as your club’s data-protection policy allows. Physical figures derived from tracking are for tactical analysis only, not for medical or load decisions.';

/** Size classes of a proposed time change |proposed − fitted|, in seconds. */
export const SIZE_CLASSES: { label: string; max: number }[] = [
  { label: '< 0.2 s', max: 0.2 },
  { label: '0.2–0.5 s', max: 0.5 },
  { label: '0.5–1 s', max: 1 },
  { label: '1–2 s', max: 2 },
  { label: '2–5 s', max: 5 },
  { label: '≥ 5 s', max: Infinity },
];

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
const num = (v: number, d: number) => (Number.isFinite(v) ? v.toFixed(d) : '—');
const mmss = (s: number) => (Number.isFinite(s) ? `${Math.floor(s / 60)}:${(s % 60).toFixed(1).padStart(4, '0')}` : '—');

export function correctionCounts(events: CorrectedEventRow[]) {
  const byChange: Record<string, Record<string, number>> = {};
  const bySize = SIZE_CLASSES.map(() => 0);
  for (const e of events) {
    (byChange[e.change] ??= {})[e.status] = (byChange[e.change]?.[e.status] ?? 0) + 1;
    if (e.proposed_t_s !== null && e.fitted_t_s !== null) {
      const d = Math.abs(e.proposed_t_s - e.fitted_t_s);
      bySize[SIZE_CLASSES.findIndex((c) => d < c.max)]++;
    }
  }
  return { byChange, bySize };
}

/** Residuals of one segment against source time: used points filled, rejected ones crossed. */
export function residualChartSvg(s: ClockSegment, label: string): string {
  const W = 640, H = 190, L = 52, R = 12, T = 14, B = 34;
  const pts = s.points.filter((p) => Number.isFinite(p.residual) && Number.isFinite(p.t));
  const t0 = Math.min(s.fromT, ...pts.map((p) => p.t));
  const t1 = Math.max(s.toT, ...pts.map((p) => p.t), t0 + 1);
  const lim = Math.max(0.5, ...pts.map((p) => Math.abs(p.residual))) * 1.1;
  const x = (t: number) => L + ((t - t0) / (t1 - t0)) * (W - L - R);
  const y = (r: number) => T + ((lim - r) / (2 * lim)) * (H - T - B);
  const rms = Number.isFinite(s.rmsResidual) ? s.rmsResidual : 0;
  const ticks = [-lim, -lim / 2, 0, lim / 2, lim].map((v) => Number(v.toFixed(2)));
  const tTicks = Array.from({ length: 6 }, (_, i) => t0 + ((t1 - t0) * i) / 5);
  const parts: string[] = [];
  parts.push(`<rect x="${L}" y="${y(rms).toFixed(1)}" width="${W - L - R}" height="${Math.max(0, y(-rms) - y(rms)).toFixed(1)}" class="band"/>`);
  for (const v of ticks) parts.push(`<line x1="${L}" x2="${W - R}" y1="${y(v).toFixed(1)}" y2="${y(v).toFixed(1)}" class="${v === 0 ? 'zero' : 'grid'}"/><text x="${L - 6}" y="${(y(v) + 4).toFixed(1)}" class="tick" text-anchor="end">${v.toFixed(2)}</text>`);
  for (const t of tTicks) parts.push(`<text x="${x(t).toFixed(1)}" y="${H - B + 16}" class="tick" text-anchor="middle">${mmss(t)}</text>`);
  for (const p of pts) {
    const cx = x(p.t).toFixed(1), cy = y(p.residual).toFixed(1);
    const tip = `<title>${esc(`${p.kind} ${p.anchorId}: residual ${p.residual.toFixed(3)} s${p.used ? '' : ` — not used: ${p.rejectedBecause ?? 'rejected'}`}`)}</title>`;
    parts.push(p.used ? `<circle cx="${cx}" cy="${cy}" r="3.2" class="used">${tip}</circle>` : `<path d="M${Number(cx) - 4},${Number(cy) - 4}l8,8m0,-8l-8,8" class="rejected">${tip}</path>`);
  }
  parts.push(`<text x="${(L + W - R) / 2}" y="${H - 4}" class="axis" text-anchor="middle">${esc(label)} time since period start (m:ss)</text>`);
  parts.push(`<text x="12" y="${(T + H - B) / 2}" class="axis" text-anchor="middle" transform="rotate(-90 12 ${(T + H - B) / 2})">residual (s)</text>`);
  return `<svg class="chart" viewBox="0 0 ${W} ${H}" role="img" aria-label="Residuals of period ${s.period}, ${pts.length} anchors">${parts.join('')}</svg>`;
}

export function syncReportHtml(input: SyncReportInput): string {
  const { byChange, bySize } = correctionCounts(input.events);
  const statuses = ['accepted', 'edited', 'rejected', 'proposed', 'none'];
  const decided = input.events.filter((e) => e.status === 'accepted' || e.status === 'edited' || e.status === 'rejected').length;
  const fitSections = input.fits
    .map(({ label, fit }) => {
      const rows = fit.segments
        .map((s) => {
          const used = s.points.filter((p) => p.used).length;
          return `<tr><td>${s.period}</td><td>${mmss(s.fromT)}–${mmss(s.toT)}</td><td class="n">${num(s.offset, 3)} ± ${num(s.offsetSe, 3)}</td><td class="n">${num(s.driftPpm, 0)} ± ${num(s.rateSe * 1e6, 0)}</td><td class="n">${num(s.rmsResidual, 3)}</td><td class="n">${used} / ${s.points.length - used}</td></tr>`;
        })
        .join('');
      const charts = fit.segments.map((s) => `<figure><figcaption>Period ${s.period}, ${mmss(s.fromT)}–${mmss(s.toT)}: residual of each anchor after the fit (shaded: ± RMS)</figcaption>${residualChartSvg(s, label)}</figure>`).join('');
      return `<section><h2>Clock fit: ${esc(label)} (${esc(fit.source)} clock → tracking)</h2>
<p class="muted">Model per segment: tracking time = offset + rate × ${esc(fit.source)} time; drift = (rate − 1) × 10⁶ ppm. Method: ${esc(fit.method)}.</p>
<table><thead><tr><th>Period</th><th>Segment</th><th>Offset (s)</th><th>Drift (ppm)</th><th>RMS residual (s)</th><th>Anchors used / rejected</th></tr></thead><tbody>${rows}</tbody></table>
${charts}</section>`;
    })
    .join('');
  const changeRows = Object.entries(byChange)
    .map(([change, counts]) => `<tr><td>${esc(change)}</td>${statuses.map((s) => `<td class="n">${counts[s] ?? 0}</td>`).join('')}<td class="n">${Object.values(counts).reduce((a, b) => a + b, 0)}</td></tr>`)
    .join('');
  const maxSize = Math.max(1, ...bySize);
  const sizeRows = SIZE_CLASSES.map(
    (c, i) => `<tr><td>${c.label}</td><td class="n">${bySize[i]}</td><td class="barcell"><svg viewBox="0 0 200 12" class="bar" aria-hidden="true"><rect width="${((bySize[i] / maxSize) * 200).toFixed(1)}" height="12"/></svg></td></tr>`,
  ).join('');
  const nonLive = input.nonLive.length
    ? `<table><thead><tr><th>Footage</th><th>From</th><th>To</th><th>Length (s)</th><th>Kind</th><th>Status</th><th>Note</th></tr></thead><tbody>${input.nonLive
        .map((n) => `<tr><td>${esc(n.footage)}</td><td class="n">${mmss(n.fromT)}</td><td class="n">${mmss(n.toT)}</td><td class="n">${num(n.toT - n.fromT, 1)}</td><td>${esc(n.kind.replace('_', ' '))}</td><td>${esc(n.status)}</td><td>${esc(n.note ?? '')}</td></tr>`)
        .join('')}</tbody></table>`
    : '<p class="muted">No non-live intervals are recorded for this match’s footage.</p>';
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Sync report — ${esc(input.title)}</title>
<style>${REPORT_CSS}</style></head>
<body><main>
<header><h1>Sync report</h1><p class="match">${esc(input.title)}</p>
<p class="muted">Made ${esc(input.generatedAt)} by ${esc(input.user)}${input.appVersion ? ` with Whistlemark ${esc(input.appVersion)}` : ''}. ${input.events.length} logged events; ${decided} corrections decided by the analyst.</p></header>
<aside class="caution" role="note"><strong>Personal data.</strong> ${esc(DATA_PROTECTION_CAUTION)}</aside>
${fitSections || '<section><h2>Clock fit</h2><p class="muted">No clock fit has been made for this match yet.</p></section>'}
<section><h2>Corrections by kind and status</h2>
<table><thead><tr><th>Change</th>${statuses.map((s) => `<th>${s === 'none' ? 'no proposal' : s}</th>`).join('')}<th>All</th></tr></thead><tbody>${changeRows}</tbody></table>
<h3>Size of proposed time changes</h3><p class="muted">|proposed − logged time through the clock fit|, over the events the engine placed.</p>
<table class="sizes"><thead><tr><th>Size</th><th>Events</th><th></th></tr></thead><tbody>${sizeRows}</tbody></table></section>
<section><h2>Non-live footage</h2>${nonLive}</section>
</main></body></html>
`;
}

const REPORT_CSS = `
:root{--ink:#1d232b;--muted:#5b6572;--line:#d5dbe2;--accent:#1f6f8b;--warn:#8a5a00;--warnbg:#fff6e0}
*{box-sizing:border-box}body{margin:0;font:14px/1.45 system-ui,-apple-system,"Segoe UI",sans-serif;color:var(--ink);background:#f4f6f8}
main{max-width:860px;margin:24px auto;padding:28px 32px;background:#fff;border:1px solid var(--line);border-radius:6px}
h1{margin:0;font-size:24px}h2{font-size:17px;margin:28px 0 8px;padding-bottom:4px;border-bottom:2px solid var(--accent)}h3{font-size:14px;margin:18px 0 4px}
.match{font-size:18px;margin:4px 0}.muted{color:var(--muted);margin:4px 0 8px}
.caution{margin:16px 0;padding:10px 14px;border-left:4px solid var(--warn);background:var(--warnbg);color:#4a3300}
table{border-collapse:collapse;width:100%;margin:6px 0 10px}th,td{padding:4px 8px;border-bottom:1px solid var(--line);text-align:left;vertical-align:top}
th{font-weight:600;font-size:12px;color:var(--muted);text-transform:uppercase;letter-spacing:.03em}td.n{text-align:right;font-variant-numeric:tabular-nums}
table.sizes{width:auto}td.barcell{width:210px}.bar rect{fill:var(--accent)}
figure{margin:10px 0 14px;break-inside:avoid}figcaption{font-size:12px;color:var(--muted);margin-bottom:2px}
.chart{width:100%;height:auto;display:block}.chart .grid{stroke:#e6eaee;stroke-width:1}.chart .zero{stroke:#8895a3;stroke-width:1.2}
.chart .band{fill:#1f6f8b;fill-opacity:.10}.chart .used{fill:var(--accent)}.chart .rejected{stroke:#b3261e;stroke-width:2;fill:none}
.chart .tick{font-size:10px;fill:var(--muted)}.chart .axis{font-size:11px;fill:var(--ink)}
@media print{@page{size:A4;margin:14mm}body{background:#fff;font-size:11pt}main{margin:0;padding:0;border:0;max-width:none}
section{break-inside:auto}h2{break-after:avoid}table,figure,.caution{break-inside:avoid}
.caution,.chart .band,.bar rect{-webkit-print-color-adjust:exact;print-color-adjust:exact}}
`;
