/**
 * The rules pane: each rule of the selected site with each guard's status from the
 * session's explanation: ✓ holds, ✗ fails (with what it waits for), · not reached. Rules
 * that fired at the cursor's event are marked, and static-analysis findings shown. Rules a
 * role made are grouped under the role and its values, each naming its line in the role.
 */
import type { RuleOrigin } from '../../model/types.js';
import { formatDuration } from '../../model/units.js';
import type { RuleReport } from '../../session/session.js';
import type { Line } from '../lines.js';
import { wrap } from '../text.js';
import type { PaneView } from './network.js';

const MARK = { holds: '✓', fails: '✗', unreached: '·' } as const;

/** `role repeater (left=s0 right=s16)`: what a group of rules is. */
function roleHeading(from: RuleOrigin): string {
  const values = from.args.map(([k, v]) => `${k}=${v}`).join(' ');
  return `role ${from.role}${values ? ` (${values})` : ''}`;
}

/** The rules pane's lines for the reports of one site. */
export function rulesView(reports: readonly RuleReport[], site: string, cols: number): PaneView {
  if (reports.length === 0) return { lines: [[{ text: `${site} runs no rules: it only holds what its links make`, tone: 'dim' }]], note: 'none' };
  const lines: Line[] = [];
  // `lead` starts every row of the item, `hang` further indents its continuation rows
  const push = (text: string, lead: string, hang: string, tone: Line[number]['tone']) => {
    for (const l of wrap(text, cols - lead.length, hang)) lines.push([{ text: lead + l, tone }]);
  };
  let ready = 0;
  // Rules a role made are grouped under the role and the values this site gives it.
  const grouped = reports.some((r) => r.from);
  let group: string | undefined;
  for (const r of reports) {
    if (r.ready) ready++;
    const g = r.from ? `use ${r.from.use}` : 'own';
    if (grouped && g !== group) {
      group = g;
      if (lines.length > 0) lines.push([{ text: '' }]);
      push(r.from ? roleHeading(r.from) : `own rules of ${site}`, '', '  ', 'title');
    }
    const state = r.firedNow ? '★ fired at this event' : r.ready ? (r.busyUntil !== undefined ? `ready once idle at ${formatDuration(r.busyUntil)}` : 'ready') : 'waits';
    lines.push([
      { text: r.rule, tone: 'strong' },
      { text: `  ${state}`, tone: r.firedNow ? 'accent' : r.ready ? 'good' : 'warn' },
    ]);
    if (r.from) push(`roles.${r.from.role}.rules[${r.from.index}], line ${r.line}`, '  ', '  ', 'dim');
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
