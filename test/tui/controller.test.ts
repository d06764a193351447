import { describe, expect, it } from 'vitest';
import { formatDuration } from '../../src/model/units.js';
import { COMMANDS, runCommand } from '../../src/tui/commands.js';
import { complete } from '../../src/tui/complete.js';
import { KEYS, keyAction } from '../../src/tui/keys.js';
import type { Key } from 'ink';
import { DISAGREE_NET, noiseWith, purificationNet, SWAP_NET } from '../engine/scenarios.js';
import { controllerFor } from './helpers.js';
import { Session } from '../../src/session/session.js';
import { Controller } from '../../src/tui/controller.js';
import { engineFrom } from '../engine/scenarios.js';

const SWAP_NOISE = noiseWith('{werner: 0.9}', '    success: 0.3\n  memory: {t2: 1 s}');

function key(over: Partial<Key> = {}): Key {
  return {
    upArrow: false, downArrow: false, leftArrow: false, rightArrow: false, pageDown: false, pageUp: false, home: false, end: false,
    return: false, escape: false, ctrl: false, shift: false, tab: false, backspace: false, delete: false, meta: false,
    super: false, hyper: false, capsLock: false, numLock: false, ...over,
  } as Key;
}

describe('the key table', () => {
  it('gives every key press at most one action, and every action a description', () => {
    const seen = new Map<string, string>();
    for (const b of KEYS) {
      expect(b.does.length).toBeGreaterThan(5);
      for (const c of b.chords) {
        const id = JSON.stringify(c);
        expect(seen.has(id), `${id} bound twice`).toBe(false);
        seen.set(id, b.action);
      }
    }
  });

  it('tells plain arrows from shifted ones, and Tab from Shift+Tab', () => {
    expect(keyAction('', key({ rightArrow: true }))).toBe('step');
    expect(keyAction('', key({ rightArrow: true, shift: true }))).toBe('continue');
    expect(keyAction('', key({ tab: true }))).toBe('focusNext');
    expect(keyAction('', key({ tab: true, shift: true }))).toBe('focusPrev');
    expect(keyAction('c', key({ ctrl: true }))).toBe('quit');
    expect(keyAction('c', key())).toBeUndefined();
  });
});

describe('commands', () => {
  it('go N puts the cursor on event #N, go TIME on the last event at or before it', () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    expect(runCommand(c, 'go 5')).toMatchObject({ ok: true });
    expect(c.session.cursor).toBe(6);
    expect(c.session.event()?.index).toBe(5);
    const h = c.session.history;
    const t = h.timeOf(3);
    expect(runCommand(c, `go ${formatDuration(t)}`)).toMatchObject({ ok: true });
    expect(h.timeOf(c.session.cursor - 1)).toBeLessThanOrEqual(t);
    expect(c.session.cursor < h.frontier ? h.timeOf(c.session.cursor) : Infinity).toBeGreaterThan(t);
    runCommand(c, 'go start');
    expect(c.session.cursor).toBe(0);
  });

  it('steps and steps back by counts', () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    runCommand(c, 'step 4');
    expect(c.session.cursor).toBe(4);
    runCommand(c, 'back 3');
    expect(c.session.cursor).toBe(1);
    expect(runCommand(c, 'step many')).toMatchObject({ ok: false, fix: 'write e.g. "step 10"' });
  });

  it('adds, disables, enables and forgets breakpoints and watches', () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    expect(runCommand(c, 'break on fire mill.swap')).toEqual({ ok: true, said: 'breakpoint 1: on fire mill.swap' });
    expect(runCommand(c, 'watch pairs(mill)')).toEqual({ ok: true, said: 'watch 2: pairs(mill)' });
    runCommand(c, 'disable 1');
    expect(c.session.breakpoints()[0].enabled).toBe(false);
    runCommand(c, 'enable 1');
    expect(c.session.breakpoints()[0].enabled).toBe(true);
    runCommand(c, 'continue');
    expect(c.session.stop.reason).toBe('breakpoint');
    runCommand(c, 'forget 2');
    expect(c.session.watches()).toHaveLength(0);
    expect(runCommand(c, 'forget 9')).toMatchObject({ ok: false, error: 'there is no breakpoint or watch 9' });
  });

  it('reports a wrong breakpoint with the session\'s fix, and never throws for a mistake', () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    const out = runCommand(c, 'break on fire mill.swop');
    expect(out.ok).toBe(false);
    for (const text of ['', 'nonsense', 'go', 'go soon', 'site mil', 'autoplay fast', 'save', 'watch', 'break', 'watch ((']) {
      expect(() => runCommand(c, text)).not.toThrow();
      expect(runCommand(c, text).ok).toBe(false);
    }
    expect(runCommand(c, 'site mil')).toMatchObject({ fix: 'did you mean mill?' });
  });

  it('saves a replay through the file writer it was given', () => {
    const files = new Map<string, string>();
    const c = controllerFor(SWAP_NET, SWAP_NOISE, { writeFile: (p, t) => void files.set(p, t) });
    runCommand(c, 'step 3');
    expect(runCommand(c, 'save out.replay.json')).toEqual({ ok: true, said: 'replay written to out.replay.json' });
    const r = JSON.parse(files.get('out.replay.json')!);
    expect(r.format).toBe('bellstep/replay@2');
    expect(r.final.events).toBe(3);
  });

  it('are all listed with a description', () => {
    for (const c of COMMANDS) expect(c.does.length).toBeGreaterThan(5);
    expect(new Set(COMMANDS.map((c) => c.word)).size).toBe(COMMANDS.length);
  });
});

describe('completion', () => {
  it('completes command words, sites, event forms and SITE.RULE names', () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    expect(complete(c.session, 'si').text).toBe('site ');
    expect(complete(c.session, 'site ri').text).toBe('site ridge');
    expect(complete(c.session, 'break o').text).toBe('break on ');
    expect(complete(c.session, 'break on fi').text).toBe('break on fire ');
    expect(complete(c.session, 'break on fire ri').text).toBe('break on fire ridge.fix-up');
    expect(complete(c.session, 'break on send sw').text).toBe('break on send swapped');
    expect(complete(c.session, 'watch fid').text).toBe('watch fidelity(');
    const many = complete(c.session, 'break on fire ');
    expect(many.options).toEqual(expect.arrayContaining(['mill.swap', 'ridge.fix-up', 'quay.relabel']));
  });

  it('extends to the common prefix when several fit', () => {
    const c = controllerFor(DISAGREE_NET, noiseWith('{werner: 0.9}'));
    const out = complete(c.session, 'break on fire kiln.');
    expect(out.options).toEqual(['kiln.start', 'kiln.conclude']);
    expect(out.text).toBe('break on fire kiln.');
  });
});

describe('the controller', () => {
  it('keeps the pair selection within the pairs held after a move', () => {
    const c = controllerFor(purificationNet(), noiseWith('{werner: 0.9}', '    success: 0.5'));
    c.act('step');
    c.act('focusNext');
    expect(c.focus).toBe('pairs');
    c.act('down');
    c.act('down');
    expect(c.pairSel).toBe(0);
  });

  it('autoplay steps on each tick and pauses at the end of the run', () => {
    const c = controllerFor(DISAGREE_NET, noiseWith('{werner: 0.9}', '    success: 0.5'), { autoplay: 5 });
    for (let i = 0; i < 50; i++) c.autoStep();
    expect(c.session.ending()).toBe('stall');
    expect(c.autoplay?.playing).toBe(false);
    expect(c.note?.lines[0]).toMatch(/stalled/);
  });

  it('continues in slices that keep the screen live, shows its progress, and Esc stops it where it got to', () => {
    const queue: (() => void)[] = [];
    const c = new Controller(new Session(engineFrom(SWAP_NET, SWAP_NOISE)), { defer: (fn) => void queue.push(fn) });
    c.act('continue');
    expect(c.busy).toBe('running forward…');
    queue.shift()!();
    const first = c.session.total;
    expect(first).toBeGreaterThan(0);
    expect(c.busy).toMatch(/^running forward: [\d,]+ events done · simulated /);
    // the cursor stays put while it runs; keys other than Esc and q wait
    expect(c.session.cursor).toBe(0);
    c.handleKey('', key({ rightArrow: true }));
    expect(c.session.cursor).toBe(0);
    queue.shift()!();
    expect(c.session.total).toBeGreaterThan(first);
    c.handleKey('', key({ escape: true }));
    expect(c.busy).toBeUndefined();
    // a valid moment: the world at the last event computed
    expect(c.session.cursor).toBe(c.session.total);
    expect(c.note?.lines[0]).toMatch(/stopped after \d+ events/);
    // the slice that was queued finds nothing left to do
    for (const fn of queue.splice(0)) fn();
    expect(c.busy).toBeUndefined();
  });

  it('takes a pasted command line in one piece as if typed key by key', () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    c.handleKey(':go 40\r', key({}));
    expect(c.mode).toBe('normal');
    expect(c.session.cursor).toBe(41);
  });

  it('refuses, inline, an event number beyond what the engine can count', () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    c.handleKey(':go 99999999999999999999\r', key({}));
    expect(c.mode).toBe('command');
    expect(c.command.hint?.lines[0]).toMatch(/more events than bellstep can count/);
    expect(c.session.total).toBe(0);
  });

  it('turns a crash into an exit with the error, not a note', () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    let got: Error | undefined;
    c.onExit((e) => (got = e));
    c.session.stepForward = () => {
      throw new TypeError('boom');
    };
    c.act('step');
    expect(got?.message).toBe('boom');
    expect(c.ended).toBe(true);
  });
});
