/**
 * The rules pane: each rule of the selected site with each guard's status from the
 * session's explanation: ✓ holds, ✗ fails (with what it waits for), · not reached. Rules
 * that fired at the cursor's event are marked, and static-analysis findings shown.
 */
import { formatDuration } from '../../model/units.js';
import type { RuleReport } from '../../session/session.js';
import type { Line } from '../lines.js';
import { wrap } from '../text.js';
import type { PaneView } from './network.js';

const MARK = { holds: '✓', fails: '✗', unreached: '·' } as const;

/** The rules pane's lines for the reports of one site. */
export function rulesView(reports: readonly RuleReport[], site: string, cols: number): PaneView {
  if (reports.length === 0) return { lines: [[{ text: `${site} runs no rules: it only holds what its links make`, tone: 'dim' }]], note: 'none' };
  const lines: Line[] = [];
  // `lead` starts every row of the item, `hang` further indents its continuation rows
  const push = (text: string, lead: string, hang: string, tone: Line[number]['tone']) => {
    for (const l of wrap(text, cols - lead.length, hang)) lines.push([{ text: lead + l, tone }]);
  };
  let ready = 0;
  for (const r of reports) {
    if (r.ready) ready++;
    const state = r.firedNow ? '★ fired at this event' : r.ready ? (r.busyUntil !== undefined ? `ready once idle at ${formatDuration(r.busyUntil)}` : 'ready') : 'waits';
    lines.push([
      { text: r.rule, tone: 'strong' },
      { text: `  ${state}`, tone: r.firedNow ? 'accent' : r.ready ? 'good' : 'warn' },
    ]);
    if (r.busyUntil !== undefined && !r.ready) push(`(site busy until ${formatDuration(r.busyUntil)})`, '  ', '', 'dim');
    for (const g of r.guards) {
      const tone = g.state === 'holds' ? 'good' : g.state === 'fails' ? 'bad' : 'dim';
      push(`${MARK[g.state]} ${g.text}${g.state === 'unreached' ? ' (not reached)' : ''}`, '  ', '  ', tone);
      if (g.state === 'fails' && g.reason) push(`→ ${g.reason}`, '    ', '  ', 'plain');
    }
    for (const f of r.lint) push(`! check: ${f}`, '  ', '  ', 'warn');
  }
  return { lines, note: `${ready}/${reports.length} ready` };
}
