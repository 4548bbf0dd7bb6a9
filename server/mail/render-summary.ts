import type { InferenceDto, OutcomeOverviewDto, OutcomeRefDto, TrendPointDto } from '@shared/api/results';
import { DIFFERENCE_TEST_STATEMENT } from '@shared/results/change-alerts';
import { formatChange, formatInterval, monthLabel, TAKE_UP_UNIT } from '@shared/results/format-figures';
import { headline } from '@shared/results/headline';
import { STANDING_CAUTIONS } from '@shared/results/standing-cautions';
import { MAIL_COLOURS as C } from './palette';
import { alertSentence, leadingCaveats, summarySubject, type ProgramSummary, type SummaryContent } from './summary-content';
import { sparkline, trendChartPng } from './trend-chart';

export interface RenderedMail {
  subject: string;
  html: string;
  text: string;
  /** Inline images, referenced from the HTML by `cid:`. */
  images: Array<{ cid: string; filename: string; content: Buffer }>;
}

/** One outcome's figures as both parts of the message write them. */
export interface OutcomeFigures {
  label: string;
  month: string | null;
  takeUpJump: string | null;
  takeUpInterval: string | null;
  itt: string | null;
  effect: string | null;
  effectInterval: string | null;
  changeFromPrevious: string | null;
  sparkline: string;
}

/** The figures of one outcome of an overview, formatted (shared by the HTML and the text part, and by tests). */
export function outcomeFigures(o: OutcomeOverviewDto, trend: readonly TrendPointDto[]): OutcomeFigures {
  const latest = o.latest?.status === 'ok' ? o.latest : null;
  const fs = headline(latest?.firstStage ?? null);
  const itt = headline(latest?.itt ?? null);
  const effect = headline(latest?.effect ?? null);
  const fmt = (i: InferenceDto | null, unit: Pick<OutcomeRefDto, 'unit'>) => (i ? formatChange(i.estimate, unit) : null);
  const change = o.changeFromPrevious?.effect;
  return {
    label: o.outcome.label,
    month: o.latest ? monthLabel(o.latest.scope.lastPeriod) : null,
    takeUpJump: fmt(fs, TAKE_UP_UNIT),
    takeUpInterval: fs ? formatInterval(fs, TAKE_UP_UNIT) : null,
    itt: fmt(itt, o.outcome),
    effect: fmt(effect, o.outcome),
    effectInterval: effect ? formatInterval(effect, o.outcome) : null,
    changeFromPrevious: change === undefined || change === null ? null : formatChange(change, o.outcome),
    sparkline: sparkline(trend.map((p) => p.effect?.estimate ?? null)),
  };
}

/**
 * The director's summary: HTML (tables and inline styles only, no scripts, readable without
 * images) and a plain-text part that says the same, with a small trend chart per outcome as an
 * inline PNG and a text sparkline in the plain part.
 */
export function renderSummary(content: SummaryContent): RenderedMail {
  const images: RenderedMail['images'] = [];
  const htmlSections: string[] = [];
  const textSections: string[] = [];
  for (const p of content.programs) {
    const { html, text } = renderProgram(p, images);
    htmlSections.push(html);
    textSections.push(text);
  }
  const subject = summarySubject(content);
  const cautionsHtml = STANDING_CAUTIONS.map((c) => `<li style="margin:0 0 4px 0">${esc(c)}</li>`).join('');
  const html = `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>${esc(subject)}</title></head>
<body style="margin:0;padding:0;background:${C.paper};color:${C.ink900};font-family:'IBM Plex Sans',Arial,Helvetica,sans-serif;font-size:15px;line-height:1.45">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:${C.paper}"><tr><td align="center" style="padding:24px 12px">
<table role="presentation" width="640" cellpadding="0" cellspacing="0" style="max-width:640px;width:100%;background:${C.panel};border:1px solid ${C.rule}">
<tr><td style="padding:20px 24px 8px 24px"><div style="font-size:13px;color:${C.ink500};letter-spacing:0.02em">CUTLINE · MONTHLY SUMMARY</div>
<h1 style="margin:6px 0 0 0;font-size:22px;font-weight:600">${esc(subject)}</h1>
<p style="margin:8px 0 0 0;color:${C.ink700}">Hello ${esc(content.recipientName)}, here is what the latest months show.</p></td></tr>
${htmlSections.join('\n')}
<tr><td style="padding:16px 24px 20px 24px;border-top:1px solid ${C.rule};font-size:13px;color:${C.ink700}">
<p style="margin:0 0 6px 0;font-weight:600">Read with care</p><ul style="margin:0;padding-left:18px">${cautionsHtml}</ul>
<p style="margin:10px 0 0 0">Figures: estimate with its 95% interval (robust bias-corrected). You receive this because you are a director of these programs. <a href="${esc(content.settingsUrl)}" style="color:${C.accent500}">Change or pause this summary</a>.</p>
</td></tr></table></td></tr></table></body></html>`;
  const text = [
    subject,
    '='.repeat(Math.min(72, subject.length)),
    '',
    `Hello ${content.recipientName}, here is what the latest months show.`,
    '',
    ...textSections,
    'Read with care',
    ...STANDING_CAUTIONS.map((c) => `- ${c}`),
    '',
    'Figures: estimate with its 95% interval (robust bias-corrected).',
    `Change or pause this summary: ${content.settingsUrl}`,
    '',
  ].join('\n');
  return { subject, html, text, images };
}

function renderProgram(p: ProgramSummary, images: RenderedMail['images']): { html: string; text: string } {
  const o = p.overview;
  const lines: string[] = [o.programName, '-'.repeat(o.programName.length)];
  const parts: string[] = [];
  parts.push(`<tr><td style="padding:18px 24px 4px 24px;border-top:1px solid ${C.rule}"><h2 style="margin:0;font-size:18px;font-weight:600">${esc(o.programName)}</h2>`);
  const meta = o.latestPeriod ? `Latest month: ${monthLabel(o.latestPeriod)}${o.design ? ` · design “${o.design.name}”, version ${o.design.version}` : ''}` : 'No results yet: they appear after a month’s extract is accepted and the recompute has run.';
  parts.push(`<p style="margin:4px 0 0 0;color:${C.ink500};font-size:13px">${esc(meta)}</p></td></tr>`);
  lines.push(meta);
  if (o.stale) {
    const note = 'Some figures are being updated (newer data or settings arrived); they may change.';
    parts.push(box(note, C.caution50, C.caution));
    lines.push(`Note: ${note}`);
  }
  if (o.alerts.length > 0) {
    const sentences = o.alerts.map((a) => alertSentence(a, o));
    const hasDifference = o.alerts.some((a) => a.kind === 'difference');
    parts.push(
      box(
        `<strong>What changed</strong><ul style="margin:6px 0 0 0;padding-left:18px">${sentences.map((s) => `<li>${esc(s)}</li>`).join('')}</ul>${hasDifference ? `<p style="margin:6px 0 0 0;font-size:12px">${esc(DIFFERENCE_TEST_STATEMENT)}</p>` : ''}`,
        C.serious50,
        C.serious,
        true,
      ),
    );
    lines.push('', 'WHAT CHANGED', ...sentences.map((s) => `* ${s}`));
    if (hasDifference) lines.push(`  (${DIFFERENCE_TEST_STATEMENT})`);
  }
  const rows: string[] = [];
  for (const outcome of o.outcomes) {
    const trend = (p.trends[outcome.outcome.key] ?? []).slice(-12);
    const f = outcomeFigures(outcome, trend);
    const cid = `trend-${o.programId}-${outcome.outcome.key}@cutline`;
    const hasTrend = trend.some((t) => t.effect !== null);
    if (hasTrend) {
      images.push({ cid, filename: `trend-${outcome.outcome.key}.png`, content: trendChartPng(trend.map((t) => (t.effect ? { estimate: t.effect.estimate, ciLow: t.effect.ciLow, ciHigh: t.effect.ciHigh } : null))) });
    }
    rows.push(`<tr><td style="padding:12px 24px 0 24px">
<h3 style="margin:0 0 6px 0;font-size:15px;font-weight:600">${esc(f.label)}${f.month ? ` <span style="font-weight:400;color:${C.ink500}">· ${esc(f.month)}</span>` : ''}</h3>
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="border-collapse:collapse;font-size:14px">
${figureRow('Take-up jump at the cutoff', f.takeUpJump, f.takeUpInterval)}
${figureRow('Effect of being eligible', f.itt, null)}
${figureRow('Effect on participants at the cutoff', f.effect, f.effectInterval, true)}
${figureRow('Change from the previous month', f.changeFromPrevious, null)}
</table>
${hasTrend ? `<p style="margin:8px 0 0 0;font-size:12px;color:${C.ink500}">Effect on participants, last ${trend.length} months (band: 95% interval; grey line: no effect)</p><img src="cid:${cid}" width="360" height="90" alt="Trend of the effect on participants over the last ${trend.length} months: ${esc(f.sparkline)}" style="display:block;border:0;max-width:100%">` : ''}
</td></tr>`);
    lines.push('', `${f.label}${f.month ? ` (${f.month})` : ''}`);
    lines.push(`  Take-up jump at the cutoff:          ${f.takeUpJump ?? 'not available'}${f.takeUpInterval ? ` (${f.takeUpInterval})` : ''}`);
    lines.push(`  Effect of being eligible:            ${f.itt ?? 'not available'}`);
    lines.push(`  Effect on participants at the cutoff: ${f.effect ?? 'not available'}${f.effectInterval ? ` (${f.effectInterval})` : ''}`);
    lines.push(`  Change from the previous month:      ${f.changeFromPrevious ?? 'not available'}`);
    if (hasTrend) lines.push(`  Last ${trend.length} months: ${f.sparkline}`);
  }
  parts.push(...rows);
  const caveats = leadingCaveats(o);
  if (caveats.length > 0) {
    parts.push(
      `<tr><td style="padding:12px 24px 0 24px"><p style="margin:0 0 4px 0;font-weight:600;font-size:14px">Caveats</p><ul style="margin:0;padding-left:18px;font-size:14px">${caveats
        .map((c) => `<li style="margin:0 0 4px 0"><span style="color:${c.severity === 'serious' ? C.serious : C.caution};font-weight:600">${c.severity === 'serious' ? 'Serious' : 'Caution'}</span> (${esc(c.outcomeLabel)}): ${esc(c.message)}</li>`)
        .join('')}</ul></td></tr>`,
    );
    lines.push('', 'Caveats', ...caveats.map((c) => `- ${c.severity === 'serious' ? 'Serious' : 'Caution'} (${c.outcomeLabel}): ${c.message}`));
  }
  parts.push(`<tr><td style="padding:14px 24px 18px 24px"><a href="${esc(p.dashboardUrl)}" style="display:inline-block;background:${C.accent500};color:#ffffff;text-decoration:none;padding:8px 14px;font-weight:600;font-size:14px">Open the dashboard</a></td></tr>`);
  lines.push('', `Dashboard: ${p.dashboardUrl}`, '', '');
  return { html: parts.join('\n'), text: lines.join('\n') };
}

function figureRow(label: string, value: string | null, interval: string | null, strong = false): string {
  return `<tr><td style="padding:4px 0;border-bottom:1px solid ${C.rule};color:${C.ink700}">${esc(label)}</td><td align="right" style="padding:4px 0;border-bottom:1px solid ${C.rule};${strong ? 'font-weight:600;' : ''}white-space:nowrap">${esc(value ?? 'not available')}${interval ? `<br><span style="font-weight:400;font-size:12px;color:${C.ink500}">${esc(interval)}</span>` : ''}</td></tr>`;
}

function box(inner: string, background: string, border: string, raw = false): string {
  return `<tr><td style="padding:10px 24px 0 24px"><div style="background:${background};border-left:4px solid ${border};padding:10px 12px;font-size:14px">${raw ? inner : esc(inner)}</div></td></tr>`;
}

/** HTML-escapes text. */
export function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}
