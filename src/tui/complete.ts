/**
 * Tab completion for the command line: command words first, then, by the command's kind,
 * site names, breakpoint forms, `SITE.RULE` pairs, message kinds, debugger functions and
 * breakpoint or watch numbers.
 */
import { sentKinds as sentKindSet } from '../session/breakpoints.js';
import type { Net } from '../engine/index.js';
import { DEBUG_FUNCTION_NAMES } from '../session/debug-functions.js';
import type { Session } from '../session/session.js';
import { COMMANDS, splitCommand } from './commands.js';

export interface Completion {
  /** The command line after completion. */
  readonly text: string;
  /** The candidates that remain when more than one fits (shown under the line). */
  readonly options: readonly string[];
}

/** Message kinds that some rule sends. */
export function sentKinds(net: Net): string[] {
  return [...sentKindSet(net)].sort();
}

/** Every `SITE.RULE` of the network. */
export function siteRules(net: Net): string[] {
  const out: string[] = [];
  for (const [node, rules] of net.rules) for (const r of rules) out.push(`${node}.${r.name}`);
  return out;
}

function commonPrefix(words: readonly string[]): string {
  if (words.length === 0) return '';
  let p = words[0];
  for (const w of words) while (!w.startsWith(p)) p = p.slice(0, -1);
  return p;
}

function expressionWords(net: Net): string[] {
  const rules = new Set<string>();
  for (const rs of net.rules.values()) for (const r of rs) rules.add(r.name);
  return [...net.nodeIds, ...DEBUG_FUNCTION_NAMES.map((f) => `${f}(`), ...rules];
}

/** The candidates for the last word of a command line, and whether a space should follow a unique match. */
function candidates(session: Session, text: string): { words: string[]; space: boolean } {
  const net = session.engine.net;
  if (!/\s/.test(text)) return { words: COMMANDS.map((c) => c.word), space: true };
  const { word, rest } = splitCommand(text);
  const def = COMMANDS.find((c) => c.word === word);
  const tokens = text.slice(text.indexOf(word) + word.length).split(/\s+/).filter((t, i, a) => t || i === a.length - 1);
  switch (def?.complete) {
    case 'site':
      return { words: [...net.nodeIds], space: false };
    case 'go':
      return { words: ['start', 'end'], space: false };
    case 'id':
      return { words: [...session.breakpoints().map((b) => String(b.id)), ...session.watches().map((w) => String(w.id))], space: false };
    case 'breakpoint': {
      if (tokens[0] === 'on' && tokens.length === 2) return { words: ['fire', 'send', 'deliver', 'discard', 'stall'], space: true };
      if (tokens[0] === 'on' && tokens[1] === 'fire' && tokens.length === 3) return { words: siteRules(net), space: false };
      if (tokens[0] === 'on' && tokens[1] === 'send' && tokens.length === 3) return { words: sentKinds(net), space: false };
      if (tokens.length <= 1 && !rest.includes('(')) return { words: ['on', ...expressionWords(net)], space: false };
      return { words: expressionWords(net), space: false };
    }
    case 'expr':
      return { words: expressionWords(net), space: false };
    default:
      return { words: [], space: false };
  }
}

/** Completes the last word of a command line. */
export function complete(session: Session, text: string): Completion {
  const m = /[A-Za-z0-9_.~#-]*$/.exec(text);
  const token = m ? m[0] : '';
  const head = text.slice(0, text.length - token.length);
  const { words, space } = candidates(session, text);
  const fitting = [...new Set(words.filter((w) => w.startsWith(token)))];
  if (fitting.length === 0) return { text, options: [] };
  if (fitting.length === 1) {
    const w = fitting[0];
    return { text: head + w + (space || w === 'on' ? ' ' : ''), options: [] };
  }
  return { text: head + commonPrefix(fitting), options: fitting.slice(0, 24) };
}
