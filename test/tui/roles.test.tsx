/**
 * The debugger with a program set written with roles: the rules pane groups a site's rules
 * by role with the values in the heading and names each rule's line in its role; rule
 * names stay plain for breakpoints and completion; a program error names the role's rule.
 */
import { cleanup } from 'ink-testing-library';
import { afterEach, describe, expect, it } from 'vitest';
import { openApp } from './app-harness.js';
import { runCommand } from '../../src/tui/commands.js';
import { complete } from '../../src/tui/complete.js';
import type { Controller } from '../../src/tui/controller.js';
import { rulesView } from '../../src/tui/views/rules.js';
import { lineText } from '../../src/tui/lines.js';
import { loadDemo } from '../demos/demo-files.js';
import { fixture, where } from '../model/helpers.js';
import { controllerFor } from './helpers.js';

afterEach(() => cleanup());

const ROLES = fixture('roles-chain.net.yaml');
const NOISE = 'format: bellstep/noise@1\nseed: 9\ndefaults:\n  link: {pair: {werner: 0.95}, success: 0.3}\n';

function open(c: Controller, columns = 120, rows = 60) {
  return openApp(c, columns, rows);
}

/** The pane text of the rules of `site` at the cursor, as the pane would show it, one row per line. */
function paneRows(c: Controller, site: string, cols = 70): string[] {
  return rulesView(c.session.explain(site), site, cols).lines.map(lineText);
}

describe('the rules pane with roles', () => {
  it('groups a site’s rules by role, with its values in the heading and each rule’s line in the role', () => {
    const c = controllerFor(ROLES, NOISE);
    runCommand(c, 'step 30');
    const rows = paneRows(c, 'mid-way');
    const headings = rows.filter((l) => l.startsWith('role '));
    expect(headings).toEqual(['role taker', "role repeater (left=ford right=pier tag='high' limit=60000000)"]);
    // the swap rule sits under its heading, with the line of the role's rule
    const at = rows.indexOf(headings[1]);
    expect(rows[at + 1]).toMatch(/^swap {2}(waits|ready|★ fired at this event)$/);
    expect(rows[at + 2]).toBe(`  roles.repeater.rules[0], line ${where(ROLES, '- name: swap').line}`);
    expect(rows).toContain('  ✗ have partner ford, stage link as a');
  });

  it('sets a site’s own rules apart when it has roles too, and leaves a site without roles as it was', () => {
    const c = controllerFor(ROLES, NOISE);
    const pier = paneRows(c, 'pier');
    expect(pier.filter((l) => /^(role |own rules)/.test(l))).toEqual(['role taker', 'own rules of pier']);
    const own = pier.indexOf('own rules of pier');
    expect(pier[own + 1]).toMatch(/^hand-over {2}waits$/);
    expect(pier[own + 2]).not.toMatch(/roles\./);
    const plain = controllerFor(fixture('roles-chain-expanded.net.yaml'), NOISE);
    expect(paneRows(plain, 'pier').some((l) => l.startsWith('role ') || l.startsWith('own rules'))).toBe(false);
  });

  it('shows the grouping in the drawn frame when the site is selected', async () => {
    const c = controllerFor(ROLES, NOISE);
    const r = open(c);
    await r.until('SITES');
    r.stdin.write(':');
    await r.until('› ');
    r.stdin.write('site mid-way');
    await r.until('site mid-way█');
    r.stdin.write('\r');
    await r.until('rules of mid-way');
    // the pane wraps long lines, so read it with its rows joined
    const text = r
      .frame()
      .split('\n')
      .slice(1, -1)
      .map((l) => (l.includes('│') ? l.slice(0, l.indexOf('│')) : l))
      .join(' ')
      .replace(/\s+/g, ' ');
    expect(text).toContain("role repeater (left=ford right=pier tag='high' limit=60000000)");
    expect(text).toContain(`roles.repeater.rules[0], line ${where(ROLES, '- name: swap').line}`);
  });
});

describe('the long-chain demo in the debugger', () => {
  it('opens on ash with its roles in the rules pane', async () => {
    const demo = loadDemo('long-chain');
    const c = controllerFor(demo.net, demo.noise);
    const r = open(c);
    await r.until('rules of ash');
    for (const heading of ['role leader (right=bay)', 'role joiner', 'role terminal (far=quill)']) expect(r.frame()).toContain(heading);
    expect(r.frame()).toContain('17 sites, 16 links');
  });
});

describe('rule names from roles in commands', () => {
  it('breaks on a role’s rule by the name the pane shows, and completes it', () => {
    const c = controllerFor(ROLES, NOISE);
    const out = complete(c.session, 'break on fire mid-');
    expect(out.text).toBe('break on fire mid-way.');
    expect(out.options).toEqual(['mid-way.take', 'mid-way.swap']);
    expect(complete(c.session, 'break on fire mid-way.sw').text).toBe('break on fire mid-way.swap');
    expect(runCommand(c, 'break on fire mid-way.swap')).toEqual({ ok: true, said: 'breakpoint 1: on fire mid-way.swap' });
    runCommand(c, 'continue');
    expect(c.session.event()?.fires.some((f) => f.node === 'mid-way' && f.rule === 'swap')).toBe(true);
  });

  it('shows a program error with the role’s rule and the node', async () => {
    const net = ROLES.replace('args: {far: pier}', 'args: {far: 3}');
    const c = controllerFor(net, NOISE);
    const r = open(c);
    await r.until('SITES');
    runCommand(c, 'continue');
    await r.until('program error');
    const text = r.frame().replace(/\s+/g, ' ');
    expect(text).toContain('ford.hand-over from roles.terminal.rules[0] (at ford, far=3)');
  });
});
