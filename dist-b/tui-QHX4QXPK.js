import { createRequire as __cr } from 'module'; const require = __cr(import.meta.url);
import {
  BreakpointError,
  DEBUG_FUNCTION_NAMES,
  InputError,
  ProgramError,
  closest,
  formatDuration,
  parseDuration,
  sentKinds,
  shortPairId,
  viewPair
} from "./chunk-TJNIO5MR.js";
import "./chunk-LKYZCP33.js";

// dist/tui/commands.js
var CommandError = class extends Error {
  fix;
  constructor(message, fix) {
    super(message);
    this.fix = fix;
    this.name = "CommandError";
  }
};
function count(rest, word) {
  if (rest === "")
    return 1;
  if (!/^[0-9]+$/.test(rest))
    throw new CommandError(`${word} takes a number of events, got "${rest}"`, `write e.g. "${word} 10"`);
  return Number(rest);
}
function id(rest, word) {
  if (!/^[0-9]+$/.test(rest))
    throw new CommandError(`${word} needs the number of a breakpoint or watch`, "the list command shows the numbers");
  return Number(rest);
}
function go(t, rest) {
  const s = t.session;
  if (rest === "")
    throw new CommandError('go needs an event number, a time, "start" or "end"', 'write e.g. "go 12", "go 2.5 ms" or "go start"');
  if (rest === "start")
    return t.moved(s.goto(0));
  if (rest === "end")
    return t.moved(s.goto(s.total));
  const n = /^#?([0-9]+)$/.exec(rest);
  if (n)
    return t.moved(s.goto(Number(n[1]) + 1));
  let ns;
  try {
    ns = parseDuration(rest);
  } catch (e) {
    if (e instanceof InputError)
      throw new CommandError(`go: "${rest}" is neither an event number nor a time`, 'write e.g. "go 12" or "go 2.5 ms"');
    throw e;
  }
  const stop = s.gotoTime(ns);
  return `${t.moved(stop)} (at or before ${formatDuration(ns)})`;
}
var COMMANDS = [
  { word: "go", args: "N | TIME | start | end", does: "jump to event #N or to the last event at or before a time (e.g. 2.5 ms)", complete: "go", run: go },
  { word: "step", args: "[N]", does: "step N events forward (default 1)", complete: "none", run: (t, r) => {
    const n = count(r, "step");
    let done = 0;
    while (done < n && t.session.stepForward())
      done++;
    return t.moved();
  } },
  { word: "back", args: "[N]", does: "step N events back (default 1)", complete: "none", run: (t, r) => {
    const n = count(r, "back");
    let done = 0;
    while (done < n && t.session.stepBack())
      done++;
    return t.moved();
  } },
  { word: "continue", args: "", does: "run forward to the next breakpoint hit, stall or end", complete: "none", run: (t) => {
    t.continueForward();
    return "running forward\u2026";
  } },
  { word: "rewind", args: "", does: "run back to the previous breakpoint hit, or the start", complete: "none", run: (t) => t.moved(t.session.reverseContinue()) },
  { word: "break", args: "EXPR | on fire SITE.RULE | on send KIND | on deliver | on discard | on stall", does: "add a breakpoint", complete: "breakpoint", run: (t, r) => {
    if (!r)
      throw new CommandError("break needs a condition or an event form", 'write e.g. "break on fire mill.swap" or "break delivered() >= 2"');
    const bp = t.session.addBreakpoint(r);
    return `breakpoint ${bp.id}: ${bp.spec}`;
  } },
  { word: "watch", args: "EXPR", does: "show the value of an expression at every event", complete: "expr", run: (t, r) => {
    if (!r)
      throw new CommandError("watch needs an expression", 'write e.g. "watch pairs(mill)"');
    try {
      const w = t.session.addWatch(r);
      return `watch ${w.id}: ${w.spec}`;
    } catch (e) {
      if (e instanceof InputError)
        throw e;
      throw new CommandError(e instanceof Error ? e.message : String(e), 'a watch is an expression such as "pairs(mill)"; use break for event forms');
    }
  } },
  { word: "forget", args: "ID", does: "remove a breakpoint or a watch", complete: "id", run: (t, r) => {
    const n = id(r, "forget");
    if (t.session.removeBreakpoint(n))
      return `breakpoint ${n} removed`;
    if (t.session.removeWatch(n))
      return `watch ${n} removed`;
    throw new CommandError(`there is no breakpoint or watch ${n}`, "the list command shows the numbers");
  } },
  { word: "disable", args: "ID", does: "keep a breakpoint but stop it from hitting", complete: "id", run: (t, r) => {
    const n = id(r, "disable");
    if (!t.session.enableBreakpoint(n, false))
      throw new CommandError(`there is no breakpoint ${n}`, "the list command shows the numbers");
    return `breakpoint ${n} disabled`;
  } },
  { word: "enable", args: "ID", does: "let a disabled breakpoint hit again", complete: "id", run: (t, r) => {
    const n = id(r, "enable");
    if (!t.session.enableBreakpoint(n, true))
      throw new CommandError(`there is no breakpoint ${n}`, "the list command shows the numbers");
    return `breakpoint ${n} enabled`;
  } },
  { word: "list", args: "", does: "list the breakpoints and watches", complete: "none", run: (t) => {
    t.openList();
    return "breakpoints and watches";
  } },
  { word: "site", args: "SITE", does: "select a site for the pairs and rules panes", complete: "site", run: (t, r) => {
    const ids = t.session.engine.net.nodeIds;
    if (!ids.includes(r)) {
      const near = closest(r, ids);
      throw new CommandError(`there is no site "${r}"`, near ? `did you mean ${near}?` : `the sites are ${ids.join(", ")}`);
    }
    t.selectSite(r);
    return `site ${r} selected`;
  } },
  { word: "save", args: "FILE", does: "write a replay file of everything computed so far", complete: "none", run: (t, r) => {
    if (!r)
      throw new CommandError("save needs a file name", 'write e.g. "save stall.replay.json"');
    t.saveReplay(r);
    return `replay written to ${r}`;
  } },
  { word: "autoplay", args: "RATE | off", does: "step on its own at RATE events per second (Space pauses)", complete: "none", run: (t, r) => {
    if (r === "off") {
      t.setAutoplay(null);
      return "autoplay off";
    }
    const rate = Number(r);
    if (!r || !Number.isFinite(rate) || rate <= 0 || rate > 100)
      throw new CommandError('autoplay needs a rate in events per second, up to 100, or "off"', 'write e.g. "autoplay 2"');
    t.setAutoplay(rate);
    return `autoplay at ${rate} events per second`;
  } },
  { word: "help", args: "", does: "show the keys and commands", complete: "none", run: (t) => {
    t.openHelp();
    return "help";
  } },
  { word: "quit", args: "", does: "leave the debugger", complete: "none", run: (t) => {
    t.quit();
    return "bye";
  } }
];
function splitCommand(text) {
  const t = text.trim();
  const sp = t.search(/\s/);
  return sp < 0 ? { word: t, rest: "" } : { word: t.slice(0, sp), rest: t.slice(sp + 1).trim() };
}
function runCommand(t, text) {
  const { word, rest } = splitCommand(text);
  if (!word)
    return { ok: false, error: "type a command", fix: "Tab lists the commands; ? shows them all" };
  const def = COMMANDS.find((c) => c.word === word);
  if (!def) {
    const near = closest(word, COMMANDS.map((c) => c.word));
    return { ok: false, error: `there is no command "${word}"`, fix: near ? `did you mean "${near}"?` : "Tab lists the commands; ? shows them all" };
  }
  try {
    return { ok: true, said: def.run(t, rest) };
  } catch (e) {
    if (e instanceof CommandError)
      return { ok: false, error: e.message, fix: e.fix };
    if (e instanceof InputError)
      return { ok: false, error: e.message, fix: e.fix };
    throw e;
  }
}

// dist/tui/complete.js
function sentKinds2(net) {
  return [...sentKinds(net)].sort();
}
function siteRules(net) {
  const out = [];
  for (const [node, rules] of net.rules)
    for (const r of rules)
      out.push(`${node}.${r.name}`);
  return out;
}
function commonPrefix(words) {
  if (words.length === 0)
    return "";
  let p = words[0];
  for (const w of words)
    while (!w.startsWith(p))
      p = p.slice(0, -1);
  return p;
}
function expressionWords(net) {
  const rules = /* @__PURE__ */ new Set();
  for (const rs of net.rules.values())
    for (const r of rs)
      rules.add(r.name);
  return [...net.nodeIds, ...DEBUG_FUNCTION_NAMES.map((f) => `${f}(`), ...rules];
}
function candidates(session, text) {
  const net = session.engine.net;
  if (!/\s/.test(text))
    return { words: COMMANDS.map((c) => c.word), space: true };
  const { word, rest } = splitCommand(text);
  const def = COMMANDS.find((c) => c.word === word);
  const tokens = text.slice(text.indexOf(word) + word.length).split(/\s+/).filter((t, i, a) => t || i === a.length - 1);
  switch (def?.complete) {
    case "site":
      return { words: [...net.nodeIds], space: false };
    case "go":
      return { words: ["start", "end"], space: false };
    case "id":
      return { words: [...session.breakpoints().map((b) => String(b.id)), ...session.watches().map((w) => String(w.id))], space: false };
    case "breakpoint": {
      if (tokens[0] === "on" && tokens.length === 2)
        return { words: ["fire", "send", "deliver", "discard", "stall"], space: true };
      if (tokens[0] === "on" && tokens[1] === "fire" && tokens.length === 3)
        return { words: siteRules(net), space: false };
      if (tokens[0] === "on" && tokens[1] === "send" && tokens.length === 3)
        return { words: sentKinds2(net), space: false };
      if (tokens.length <= 1 && !rest.includes("("))
        return { words: ["on", ...expressionWords(net)], space: false };
      return { words: expressionWords(net), space: false };
    }
    case "expr":
      return { words: expressionWords(net), space: false };
    default:
      return { words: [], space: false };
  }
}
function complete(session, text) {
  const m = /[A-Za-z0-9_.~#-]*$/.exec(text);
  const token = m ? m[0] : "";
  const head = text.slice(0, text.length - token.length);
  const { words, space } = candidates(session, text);
  const fitting = [...new Set(words.filter((w) => w.startsWith(token)))];
  if (fitting.length === 0)
    return { text, options: [] };
  if (fitting.length === 1) {
    const w = fitting[0];
    return { text: head + w + (space || w === "on" ? " " : ""), options: [] };
  }
  return { text: head + commonPrefix(fitting), options: fitting.slice(0, 24) };
}

// dist/tui/event-log.js
var EventLog = class {
  session;
  capacity;
  ring;
  constructor(session, capacity = 8192) {
    this.session = session;
    this.capacity = capacity;
    this.ring = new Array(capacity);
    const h = session.history;
    const before = h.onNewEvent;
    h.onNewEvent = (ev, w) => {
      before?.(ev, w);
      this.ring[ev.index % this.capacity] = ev;
    };
  }
  /** The whole event with this index, when it is still held. */
  get(index) {
    if (index < 0)
      return void 0;
    const ev = this.ring[index % this.capacity];
    if (ev && ev.index === index)
      return ev;
    const at = this.session.event();
    return at && at.index === index ? at : void 0;
  }
};

// dist/tui/keys.js
var KEYS = [
  { action: "step", chords: [{ name: "right" }], label: "\u2192", does: "step one event forward" },
  { action: "back", chords: [{ name: "left" }], label: "\u2190", does: "step one event back" },
  { action: "continue", chords: [{ name: "right", shift: true }, { input: ">" }], label: "Shift+\u2192  >", does: "run forward to the next breakpoint hit, stall or end" },
  { action: "reverse", chords: [{ name: "left", shift: true }, { input: "<" }], label: "Shift+\u2190  <", does: "run back to the previous breakpoint hit, or the start" },
  { action: "first", chords: [{ name: "home" }], label: "Home", does: "go to the start of the run" },
  { action: "last", chords: [{ name: "end" }], label: "End", does: "go to the last event computed so far" },
  { action: "up", chords: [{ name: "up" }], label: "\u2191", does: "previous site, pair or event in the focused pane; scroll up elsewhere" },
  { action: "down", chords: [{ name: "down" }], label: "\u2193", does: "next site, pair or event in the focused pane; scroll down elsewhere" },
  { action: "pageUp", chords: [{ name: "pageUp" }], label: "PgUp", does: "scroll the focused pane a page up (the timeline: back in time)" },
  { action: "pageDown", chords: [{ name: "pageDown" }], label: "PgDn", does: "scroll the focused pane a page down" },
  { action: "enter", chords: [{ name: "return" }], label: "Enter", does: "pairs: show or hide the Bell coefficients \xB7 events: go to the selected event \xB7 sites: read its rules" },
  { action: "focusNext", chords: [{ name: "tab" }], label: "Tab", does: "focus the next pane" },
  { action: "focusPrev", chords: [{ name: "tab", shift: true }], label: "Shift+Tab", does: "focus the previous pane" },
  { action: "play", chords: [{ input: " " }], label: "Space", does: "pause or resume autoplay (teaching mode)" },
  { action: "command", chords: [{ input: ":" }], label: ":", does: "open the command line (Tab completes, Enter runs, Esc closes)" },
  { action: "goto", chords: [{ input: "#" }], label: "#", does: 'open the command line with "go " typed: an event number or a time' },
  { action: "help", chords: [{ input: "?" }], label: "?", does: "show or hide this help" },
  { action: "close", chords: [{ name: "escape" }], label: "Esc", does: "close the help, a list or the command line" },
  { action: "quit", chords: [{ input: "q" }, { input: "c", ctrl: true }], label: "q  Ctrl+C", does: "leave the debugger" }
];
function named(key, name) {
  switch (name) {
    case "left":
      return key.leftArrow;
    case "right":
      return key.rightArrow;
    case "up":
      return key.upArrow;
    case "down":
      return key.downArrow;
    case "pageUp":
      return key.pageUp;
    case "pageDown":
      return key.pageDown;
    case "home":
      return key.home;
    case "end":
      return key.end;
    case "return":
      return key.return;
    case "escape":
      return key.escape;
    case "tab":
      return key.tab;
  }
}
function matches(chord, input, key) {
  if (chord.name)
    return named(key, chord.name) && (chord.shift ?? false) === key.shift;
  return input === chord.input && (chord.ctrl ?? false) === key.ctrl;
}
function keyAction(input, key) {
  for (const b of KEYS)
    if (b.chords.some((c) => matches(c, input, key)))
      return b.action;
  return void 0;
}
var KEY_HINTS = "\u2192 step  \u2190 back  Shift+\u2192 continue  Tab pane  : command  ? help  q quit";

// dist/tui/layout.js
var PANES = ["network", "pairs", "rules", "messages", "events", "timeline"];
function distribute(total, weights, min = 3) {
  const sum = weights.reduce((a, b) => a + b, 0);
  const spare = Math.max(0, total - min * weights.length);
  const parts = weights.map((w) => min + Math.floor(spare * w / sum));
  let left = total - parts.reduce((a, b) => a + b, 0);
  const order = weights.map((w, i) => [w, i]).sort((a, b) => b[0] - a[0]);
  for (let k = 0; left > 0; k = (k + 1) % order.length, left--)
    parts[order[k][1]]++;
  return parts;
}
function column(width2, rows2, ids, weights) {
  const h = distribute(rows2, weights);
  return { width: width2, panes: ids.map((id2, i) => ({ id: id2, height: h[i] })) };
}
function layout(cols, rows2, focus) {
  if (cols < 60 || rows2 < 12)
    return { kind: "single", columns: [{ width: cols, panes: [{ id: focus, height: rows2 }] }] };
  if (cols >= 140 && rows2 >= 30) {
    const a = Math.floor(cols * 0.3);
    const b = Math.floor(cols * 0.33);
    return {
      kind: "three",
      columns: [
        column(a, rows2, ["network", "pairs"], [3, 7]),
        column(b, rows2, ["rules", "messages"], [6, 4]),
        column(cols - a - b, rows2, ["timeline", "events"], [6, 4])
      ]
    };
  }
  const left = Math.floor(cols / 2);
  return {
    kind: "two",
    columns: [
      column(left, rows2, ["network", "pairs", "rules"], [2, 3, 5]),
      column(cols - left, rows2, ["timeline", "messages", "events"], [4.5, 2, 3.5])
    ]
  };
}

// dist/tui/text.js
function width(s) {
  let n = 0;
  for (const _ of s)
    n++;
  return n;
}
function fit(s, w) {
  if (w <= 0)
    return "";
  const cps = [...s];
  if (cps.length <= w)
    return s;
  return `${cps.slice(0, Math.max(0, w - 1)).join("")}\u2026`;
}
function pad(s, w) {
  const f = fit(s, w);
  return f + " ".repeat(Math.max(0, w - width(f)));
}
function padLeft(s, w) {
  const f = fit(s, w);
  return " ".repeat(Math.max(0, w - width(f))) + f;
}
function wrap(text, w, indent = "") {
  const room = Math.max(1, w);
  const ind = width(indent) < room ? indent : "";
  const out = [];
  let cur = "";
  for (const word of text.split(/\s+/).filter(Boolean)) {
    let rest = word;
    while (rest) {
      const lead = cur === "" ? out.length ? ind : "" : `${cur} `;
      if (width(lead) + width(rest) <= room) {
        cur = lead + rest;
        rest = "";
      } else if (cur !== "") {
        out.push(cur);
        cur = "";
      } else {
        const cps = [...rest];
        const take = Math.max(1, room - width(lead));
        out.push(lead + cps.slice(0, take).join(""));
        rest = cps.slice(take).join("");
      }
    }
  }
  if (cur !== "" || out.length === 0)
    out.push(cur);
  return out;
}
var EIGHTHS = ["", "\u258F", "\u258E", "\u258D", "\u258C", "\u258B", "\u258A", "\u2589"];
function bar(value, cells) {
  const v = Math.min(1, Math.max(0, Number.isFinite(value) ? value : 0));
  const eighths = Math.round(v * cells * 8);
  const full = Math.floor(eighths / 8);
  const part = eighths % 8;
  const body = "\u2588".repeat(full) + (full < cells ? EIGHTHS[part] : "");
  return body + "\xB7".repeat(Math.max(0, cells - width(body)));
}

// dist/tui/views/network.js
function linkPairCount(net, w, linkId2) {
  const def = net.links.get(linkId2)?.def;
  if (!def)
    return 0;
  const [a, b] = def.ends;
  let n = 0;
  for (const p of Object.values(w.nodes[a]?.pairs ?? {}))
    if (p.link === linkId2 && p.partner === b)
      n++;
  return n;
}
function chainOrder(net) {
  const ids = net.nodeIds;
  if (ids.length < 2 || net.links.size !== ids.length - 1)
    return void 0;
  const nbrs = new Map(ids.map((id2) => [id2, []]));
  for (const { def } of net.links.values()) {
    nbrs.get(def.ends[0]).push(def.ends[1]);
    nbrs.get(def.ends[1]).push(def.ends[0]);
  }
  if ([...nbrs.values()].some((n) => n.length > 2 || n.length === 0))
    return void 0;
  const start = ids.find((id2) => nbrs.get(id2).length === 1);
  if (!start)
    return void 0;
  const order = [start];
  let prev = "";
  let cur = start;
  for (; ; ) {
    const next = nbrs.get(cur).find((n) => n !== prev);
    if (next === void 0)
      break;
    order.push(next);
    prev = cur;
    cur = next;
  }
  return order.length === ids.length ? order : void 0;
}
function linkId(a, b) {
  return a < b ? `${a}~${b}` : `${b}~${a}`;
}
function chainPicture(net, w, order, site, cols) {
  const tokens = [];
  order.forEach((id2, i) => {
    const tok = [];
    if (i > 0) {
      const n = linkPairCount(net, w, linkId(order[i - 1], id2));
      tok.push({ text: `\u2500${n}\u2500`, tone: n > 0 ? "good" : "dim" });
    }
    tok.push(id2 === site ? { text: `[${id2}]`, tone: "select" } : { text: id2, tone: "strong" });
    tokens.push(tok);
  });
  const out = [[]];
  let used = 0;
  for (const tok of tokens) {
    const tw = width(tok.map((s) => s.text).join(""));
    if (used + tw > cols && used > 0) {
      out.push([]);
      used = 0;
    }
    out[out.length - 1].push(...tok);
    used += tw;
  }
  if (out.length > 3 || out.some((l) => width(l.map((s) => s.text).join("")) > cols))
    return [];
  return out;
}
function networkView(net, w, site, cols) {
  const lines = [];
  const order = chainOrder(net);
  if (order) {
    const pic = chainPicture(net, w, order, site, cols);
    if (pic.length)
      lines.push(...pic, [{ text: "", tone: "plain" }]);
  }
  const ids = order ?? net.nodeIds;
  const idW = Math.min(12, Math.max(...ids.map((id2) => width(id2))));
  let anchor = 0;
  for (const id2 of ids) {
    const node = w.nodes[id2];
    const selected = id2 === site;
    if (selected)
      anchor = lines.length;
    const held = Object.keys(node.pairs).length;
    const segs = [
      { text: selected ? "\u25B8 " : "  ", tone: selected ? "select" : "plain" },
      { text: pad(id2, idW), tone: selected ? "select" : "strong" },
      { text: ` ${held}/${net.qubitsAt.get(id2) ?? 0}q`, tone: "dim" }
    ];
    for (const lid of net.linksAt.get(id2) ?? []) {
      const def = net.links.get(lid).def;
      const other = def.ends[0] === id2 ? def.ends[1] : def.ends[0];
      const n = linkPairCount(net, w, lid);
      segs.push({ text: ` ${other}:`, tone: "plain" }, { text: String(n), tone: n > 0 ? "good" : "dim" });
    }
    if (node.inbox.length)
      segs.push({ text: `  \u2709${node.inbox.length}`, tone: "warn" });
    if (node.busyUntil > w.time)
      segs.push({ text: "  busy", tone: "warn" });
    lines.push(segs);
  }
  return { lines, anchor, note: `${net.nodeIds.length} sites, ${net.links.size} links` };
}

// dist/tui/views/pairs.js
function pairsAt(net, w, site) {
  const recs = Object.values(w.nodes[site]?.pairs ?? {}).sort((a, b) => a.order - b.order);
  return recs.map((p) => {
    const v = viewPair(net, w, site, p.qubit, w.time);
    return { qubit: p.qubit, id: p.id, partner: p.partner, stage: p.stage, age: w.time - p.born, fidelity: v.fidelity, bell: v.bell };
  });
}
function fidelityTone(f) {
  return f >= 0.9 ? "good" : f >= 0.7 ? "warn" : "bad";
}
var BELL_NAMES = ["\u03A6+", "\u03A6\u2212", "\u03A8+", "\u03A8\u2212"];
function fidelitySegs(r, cells) {
  if (r.fidelity === void 0)
    return [{ text: `F ? ${r.partner} holds no half with this id`, tone: "dim" }];
  return [
    { text: bar(r.fidelity, cells), tone: fidelityTone(r.fidelity) },
    { text: ` F ${r.fidelity.toFixed(3)}`, tone: "plain" }
  ];
}
function pairsView(rows2, selected, bellOpen, cols, focused) {
  if (rows2.length === 0)
    return { lines: [[{ text: "holds no pairs right now", tone: "dim" }]], note: "0" };
  const lines = [];
  let anchor = 0;
  const wide = cols >= 58;
  rows2.forEach((r, i) => {
    const sel = i === selected;
    if (sel)
      anchor = lines.length;
    const mark = { text: sel && focused ? "\u25B8 " : sel ? "\u203A " : "  ", tone: sel && focused ? "select" : "plain" };
    const id2 = { text: pad(shortPairId(r.id), 8), tone: "strong" };
    if (wide) {
      lines.push([
        mark,
        id2,
        { text: ` ${pad(r.partner, 8)} ${pad(r.stage, 9)}`, tone: "plain" },
        { text: `${padLeft(formatDuration(r.age), 9)}  `, tone: "dim" },
        ...fidelitySegs(r, 10)
      ]);
    } else {
      lines.push([mark, id2, { text: ` \u2194 ${r.partner} \xB7 ${r.stage} \xB7 ${formatDuration(r.age)}`, tone: "plain" }]);
      lines.push([{ text: "    ", tone: "plain" }, ...fidelitySegs(r, Math.max(4, Math.min(10, cols - 16)))]);
    }
    if (bellOpen.has(r.qubit)) {
      const text = r.bell ? r.bell.map((c, k) => `${BELL_NAMES[k]} ${c.toFixed(3)}`).join("  ") : `Bell coefficients unknown: ${r.partner} holds no half with this id`;
      for (const l of wrap(text, cols - 4))
        lines.push([{ text: `    ${l}`, tone: "accent" }]);
    }
  });
  return { lines, anchor, note: String(rows2.length) };
}

// dist/tui/controller.js
var CONTINUE_MAX = 1e6;
var Controller = class {
  session;
  opts;
  log;
  colour;
  /** Bumped on every change; panes cache their lines by it. */
  version = 0;
  focus = "network";
  site;
  mode = "normal";
  note;
  /** Set while a long continue runs. */
  busy;
  pairSel = 0;
  bellOpen = /* @__PURE__ */ new Set();
  /** The selected event in the events pane; null follows the cursor. */
  eventSel = null;
  /** Scroll offsets of the text panes (for the timeline: rows back from the cursor). */
  scroll = { network: 0, pairs: 0, rules: 0, messages: 0, events: 0, timeline: 0 };
  overlayScroll = 0;
  command = { text: "" };
  autoplay;
  /** Page height of the focused pane, set by the frame builder for PgUp/PgDn. */
  pageRows = 10;
  listeners = /* @__PURE__ */ new Set();
  history = [];
  historyAt = 0;
  defer;
  exitFn;
  ended = false;
  constructor(session, opts = {}) {
    this.session = session;
    this.opts = opts;
    this.log = new EventLog(session, opts.logCapacity);
    this.colour = opts.colour ?? true;
    this.defer = opts.defer ?? ((fn) => void setImmediate(fn));
    const net = session.engine.net;
    this.site = net.nodeIds.find((id2) => (net.rules.get(id2)?.length ?? 0) > 0) ?? net.nodeIds[0];
    this.autoplay = opts.autoplay ? { rate: opts.autoplay, playing: true } : null;
  }
  /** Calls `fn` after every change; returns the unsubscribe function. */
  subscribe(fn) {
    this.listeners.add(fn);
    return () => void this.listeners.delete(fn);
  }
  /** Sets how the debugger ends: `exit()` on quit, `exit(error)` on a crash. */
  onExit(fn) {
    this.exitFn = fn;
  }
  changed() {
    this.version++;
    for (const fn of this.listeners)
      fn();
  }
  say(text, tone = "plain") {
    this.note = { lines: typeof text === "string" ? [text] : text, tone };
  }
  /** Runs an action; mistakes in programs or breakpoints become notes, anything else ends the debugger as a crash. */
  guarded(fn) {
    try {
      fn();
    } catch (e) {
      if (e instanceof ProgramError)
        this.say(["program error: " + e.format().split("\n")[0], ...e.fix ? [`fix: ${e.fix}`] : []], "bad");
      else if (e instanceof BreakpointError)
        this.say([e.message, "fix: disable or forget that breakpoint (list shows them)"], "bad");
      else {
        this.crash(e instanceof Error ? e : new Error(String(e)));
        return;
      }
    }
    this.changed();
  }
  /** Ends the debugger with an internal error (the CLI restores the terminal and writes the automatic replay). */
  crash(error) {
    this.ended = true;
    if (this.exitFn)
      this.exitFn(error);
    else
      throw error;
  }
  quit() {
    this.ended = true;
    this.exitFn?.();
  }
  // ------------------------------------------------------------------ cursor moves
  /** After the cursor moved: selections follow it and the stop is described. */
  moved(stop = this.session.stop) {
    this.eventSel = null;
    this.scroll.timeline = 0;
    const n = pairsAt(this.session.engine.net, this.session.world(), this.site).length;
    this.pairSel = Math.min(this.pairSel, Math.max(0, n - 1));
    const c = this.session.cursor;
    return `${c === 0 ? "at the start" : `at event #${c - 1}`}: ${stop.detail}`;
  }
  move(fn, quiet = false) {
    const r = fn();
    const text = this.moved(typeof r === "boolean" ? this.session.stop : r);
    if (!quiet || typeof r !== "boolean" || !r)
      this.say(text, this.stopTone());
    else
      this.note = void 0;
  }
  stopTone() {
    const s = this.session.stop.reason;
    return s === "stall" ? "bad" : s === "breakpoint" ? "accent" : s === "idle" || s === "limit" ? "warn" : "plain";
  }
  /** Starts a reverse-continue (or any one long call) after a "running…" frame, so the screen says what is going on. */
  runLong(label, fn) {
    if (this.busy)
      return;
    this.busy = label;
    this.changed();
    this.defer(() => {
      this.guarded(() => {
        try {
          this.move(fn);
        } finally {
          this.busy = void 0;
        }
      });
    });
  }
  cancelRun = false;
  /**
   * Continues in slices of the session's continue limit, handing the event loop back
   * between slices, so the count on screen moves and Esc or Ctrl+C stop the run.
   */
  continueForward() {
    if (this.busy)
      return;
    const s = this.session;
    const from = s.cursor;
    this.cancelRun = false;
    const slice = () => {
      this.guarded(() => {
        let stop;
        try {
          stop = s.continue();
        } catch (e) {
          this.busy = void 0;
          throw e;
        }
        const ran = s.cursor - from;
        if (stop.reason === "limit" && !this.cancelRun && !this.ended && ran < CONTINUE_MAX) {
          this.busy = `running forward\u2026 ${ran} events so far (Esc stops)`;
          this.defer(slice);
          return;
        }
        this.busy = void 0;
        const why = this.cancelRun ? `stopped by Esc after ${ran} events` : stop.reason === "limit" ? `ran ${ran} events without a breakpoint hit; Shift+\u2192 goes on` : void 0;
        this.move(() => stop);
        if (why)
          this.say(`at event #${s.cursor - 1}: ${why}`, "warn");
      });
    };
    this.busy = "running forward\u2026";
    this.changed();
    this.defer(slice);
  }
  /** One autoplay tick: a step, pausing at the end of the run. */
  autoStep() {
    if (!this.autoplay?.playing || this.busy || this.mode !== "normal")
      return;
    this.guarded(() => {
      if (!this.session.stepForward()) {
        this.autoplay = { ...this.autoplay, playing: false };
        this.move(() => this.session.stop);
      } else
        this.moved();
    });
  }
  setAutoplay(rate) {
    this.autoplay = rate === null ? null : { rate, playing: true };
  }
  // ------------------------------------------------------------------ selection
  selectSite(site) {
    if (site === this.site)
      return;
    this.site = site;
    this.pairSel = 0;
    this.bellOpen.clear();
    this.scroll.rules = 0;
    this.scroll.pairs = 0;
  }
  moveSelection(delta) {
    const s = this.session;
    switch (this.focus) {
      case "network": {
        const order = chainOrder(s.engine.net) ?? [...s.engine.net.nodeIds];
        const i = order.indexOf(this.site);
        this.selectSite(order[Math.min(order.length - 1, Math.max(0, i + delta))]);
        return;
      }
      case "pairs": {
        const n = pairsAt(s.engine.net, s.world(), this.site).length;
        this.pairSel = Math.min(Math.max(0, n - 1), Math.max(0, this.pairSel + delta));
        return;
      }
      case "events": {
        const total = s.history.records.length;
        const from = this.eventSel ?? Math.max(0, s.cursor - 1);
        this.eventSel = Math.min(Math.max(0, total - 1), Math.max(0, from + delta));
        return;
      }
      case "timeline":
        this.scroll.timeline = Math.min(Math.max(0, s.cursor - 1), Math.max(0, this.scroll.timeline - delta));
        return;
      default:
        this.scroll[this.focus] = Math.max(0, this.scroll[this.focus] + delta);
    }
  }
  activate() {
    const s = this.session;
    if (this.focus === "pairs") {
      const rows2 = pairsAt(s.engine.net, s.world(), this.site);
      const q = rows2[this.pairSel]?.qubit;
      if (q) {
        if (this.bellOpen.has(q))
          this.bellOpen.delete(q);
        else
          this.bellOpen.add(q);
      }
    } else if (this.focus === "events" && this.eventSel !== null) {
      const target = this.eventSel;
      this.move(() => s.goto(target + 1));
    } else if (this.focus === "network")
      this.focus = "rules";
  }
  // ------------------------------------------------------------------ keys
  /** Handles one key press from Ink. */
  handleKey(input, key) {
    if (this.ended)
      return;
    if (this.busy) {
      if (input === "c" && key.ctrl)
        this.quit();
      if (key.escape)
        this.cancelRun = true;
      return;
    }
    if (this.mode === "command")
      return this.commandKey(input, key);
    const action = keyAction(input, key);
    if (this.mode === "help" || this.mode === "list")
      return this.overlayKey(action);
    if (action)
      this.act(action);
  }
  overlayKey(action) {
    if (action === "up" || action === "down" || action === "pageUp" || action === "pageDown") {
      const d = action === "up" ? -1 : action === "down" ? 1 : action === "pageUp" ? -this.pageRows : this.pageRows;
      this.overlayScroll = Math.max(0, this.overlayScroll + d);
    } else if (action === "quit" || action === "close" || action === "help" || action === "enter")
      this.mode = "normal";
    this.changed();
  }
  /** Does what a key of the key table says. */
  act(action) {
    const s = this.session;
    switch (action) {
      case "step":
        return this.guarded(() => this.move(() => s.stepForward(), true));
      case "back":
        return this.guarded(() => this.move(() => s.stepBack(), true));
      case "continue":
        return this.continueForward();
      case "reverse":
        return this.runLong("running back\u2026", () => s.reverseContinue());
      case "first":
        return this.guarded(() => this.move(() => s.goto(0)));
      case "last":
        return this.guarded(() => this.move(() => s.goto(s.total)));
      case "up":
      case "down":
        return this.guarded(() => this.moveSelection(action === "up" ? -1 : 1));
      case "pageUp":
      case "pageDown":
        return this.guarded(() => this.moveSelection(action === "pageUp" ? -this.pageRows : this.pageRows));
      case "enter":
        return this.guarded(() => this.activate());
      case "focusNext":
      case "focusPrev": {
        const i = PANES.indexOf(this.focus);
        this.focus = PANES[(i + (action === "focusNext" ? 1 : PANES.length - 1)) % PANES.length];
        return this.changed();
      }
      case "play":
        this.autoplay = this.autoplay ? { ...this.autoplay, playing: !this.autoplay.playing } : { rate: 1, playing: true };
        this.say(this.autoplay.playing ? `autoplay: ${this.autoplay.rate} events per second (Space pauses)` : "autoplay paused (Space resumes)");
        return this.changed();
      case "command":
      case "goto":
        this.mode = "command";
        this.command.text = action === "goto" ? "go " : "";
        this.command.hint = void 0;
        this.historyAt = this.history.length;
        return this.changed();
      case "help":
        return this.openHelp();
      case "close":
        this.note = void 0;
        return this.changed();
      case "quit":
        return this.quit();
    }
  }
  // ------------------------------------------------------------------ command line
  commandKey(input, key) {
    const c = this.command;
    if (key.escape) {
      this.mode = "normal";
      c.text = "";
    } else if (key.return) {
      this.submit();
      return;
    } else if (key.tab) {
      const done = complete(this.session, c.text);
      c.text = done.text;
      c.hint = done.options.length ? { lines: [done.options.join("  ")], tone: "dim" } : void 0;
    } else if (key.backspace || key.delete) {
      c.text = [...c.text].slice(0, -1).join("");
    } else if (key.upArrow || key.downArrow) {
      this.historyAt = Math.min(this.history.length, Math.max(0, this.historyAt + (key.upArrow ? -1 : 1)));
      c.text = this.history[this.historyAt] ?? "";
    } else if (input === "c" && key.ctrl) {
      return this.quit();
    } else if (input && !key.ctrl && !key.meta) {
      const nl = input.search(/[\r\n]/);
      c.text += [...nl < 0 ? input : input.slice(0, nl)].filter((ch) => ch >= " " && ch !== "\x7F").join("");
      if (nl >= 0)
        return this.submit();
    }
    this.changed();
  }
  /** Runs the command line's text (also used by tests). */
  submit(text = this.command.text) {
    const c = this.command;
    const line = text.trim();
    if (line) {
      this.history.push(line);
      this.historyAt = this.history.length;
    }
    this.mode = "normal";
    this.guarded(() => {
      const out = runCommand(this, line);
      if (out.ok) {
        c.text = "";
        c.hint = void 0;
        if (!this.ended && this.mode === "normal")
          this.say(out.said, this.stopToneFor(line));
      } else {
        this.mode = "command";
        c.text = line;
        c.hint = { lines: [out.error, ...out.fix ? [`fix: ${out.fix}`] : []], tone: "bad" };
      }
    });
  }
  stopToneFor(line) {
    return /^(go|step|back|continue|rewind)\b/.test(line) ? this.stopTone() : "good";
  }
  saveReplay(path) {
    if (!this.opts.writeFile)
      throw new CommandError("this debugger cannot write files", "open it with bellstep debug to save replays");
    try {
      this.opts.writeFile(path, this.session.exportReplay());
    } catch (e) {
      throw new CommandError(`could not write ${path}: ${e instanceof Error ? e.message : String(e)}`, "check the folder exists and is writable");
    }
  }
  openList() {
    this.mode = "list";
    this.overlayScroll = 0;
    this.changed();
  }
  openHelp() {
    this.mode = this.mode === "help" ? "normal" : "help";
    this.overlayScroll = 0;
    this.changed();
  }
};

// dist/tui/app.js
import { jsx as _jsx4 } from "react/jsx-runtime";
import { useApp, useInput, useStdin } from "ink";
import { useCallback, useEffect as useEffect2, useRef, useState as useState2 } from "react";

// dist/tui/components/frame-view.js
import { jsx as _jsx3, jsxs as _jsxs2 } from "react/jsx-runtime";
import { Box as Box2 } from "ink";

// dist/tui/components/line-text.js
import { jsx as _jsx } from "react/jsx-runtime";
import { Text } from "ink";
import { memo } from "react";

// dist/tui/style.js
var COLOURED = {
  plain: {},
  dim: { dimColor: true },
  strong: { bold: true },
  accent: { color: "blueBright" },
  good: { color: "green" },
  warn: { color: "yellow" },
  bad: { color: "redBright" },
  select: { inverse: true, bold: true },
  title: { color: "magentaBright" },
  focus: { inverse: true, bold: true, color: "magentaBright" }
};
var MONO = {
  plain: {},
  dim: {},
  strong: { bold: true },
  accent: {},
  good: {},
  warn: {},
  bad: { bold: true },
  select: { inverse: true, bold: true },
  title: {},
  focus: { inverse: true, bold: true }
};
function toneProps(tone, colour) {
  return (colour ? COLOURED : MONO)[tone ?? "plain"];
}
function wantsColour(env) {
  return !(env.NO_COLOR !== void 0 && env.NO_COLOR !== "");
}

// dist/tui/components/line-text.js
var LineText = memo(function LineText2({ line, colour }) {
  if (line.length === 0)
    return _jsx(Text, { children: " " });
  return _jsx(Text, { wrap: "truncate-end", children: line.map((s, i) => _jsx(Text, { ...toneProps(s.tone, colour), children: s.text === "" ? " " : s.text }, i)) });
});

// dist/tui/components/pane.js
import { jsx as _jsx2, jsxs as _jsxs } from "react/jsx-runtime";
import { Box } from "ink";
import { memo as memo2 } from "react";
var Pane = memo2(function Pane2({ pane, colour }) {
  return _jsxs(Box, { flexDirection: "column", width: pane.width, height: pane.height, children: [_jsx2(LineText, { line: pane.title, colour }), pane.body.map((l, i) => _jsx2(LineText, { line: l, colour }, i))] });
});

// dist/tui/components/frame-view.js
function FrameView({ frame, colour }) {
  const body = frame.rows - frame.top.length - frame.bottom.length;
  return _jsxs2(Box2, { flexDirection: "column", width: frame.cols, height: frame.rows, children: [frame.top.map((l, i) => _jsx3(LineText, { line: l, colour }, `t${i}`)), frame.overlay ? _jsx3(Box2, { flexDirection: "column", height: body, children: frame.overlay.map((l, i) => _jsx3(LineText, { line: l, colour }, `o${i}`)) }) : _jsx3(Box2, { flexDirection: "row", height: body, children: frame.columns.map((col, i) => _jsx3(Box2, { flexDirection: "column", width: col.width, height: body, borderStyle: col.divider ? "single" : void 0, borderTop: false, borderRight: false, borderBottom: false, borderLeft: col.divider, borderDimColor: true, children: col.panes.map((p) => _jsx3(Pane, { pane: p, colour }, p.id)) }, i)) }), frame.bottom.map((l, i) => _jsx3(LineText, { line: l, colour }, `b${i}`))] });
}

// dist/session/narrate.js
var GATES = /* @__PURE__ */ new Set(["x", "y", "z", "h", "s", "sdg", "t", "rx", "ry", "rz", "cnot", "cz", "swap"]);
function short(id2) {
  const hash = id2.indexOf("#");
  return hash > 0 ? id2.slice(hash) : id2;
}
function andList(items) {
  if (items.length <= 1)
    return items.join("");
  return `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}
function plainAction(a) {
  let m;
  if (m = /^Bell-measured (\S+) and (\S+): z=(\d) x=(\d)$/.exec(a)) {
    return `Bell-measured ${m[1]} and ${m[2]} (outcomes z=${m[3]}, x=${m[4]}), entangling their far ends`;
  }
  if (m = /^measured (\S+) in (\w+): (\d)$/.exec(a))
    return `measured ${m[1]} in the ${m[2]} basis and got ${m[3]}`;
  if (m = /^sent (\S+) to (\S+)( \(lost\))?$/.exec(a))
    return `sent a "${m[1]}" message to ${m[2]}${m[3] ? " that was lost" : ""}`;
  if (m = /^delivered its half of (\S+)$/.exec(a))
    return `handed its half of ${m[1]} to the application`;
  if (m = /^delivered (\S+) \(F ([0-9.]+)\)$/.exec(a)) {
    return `handed its half of ${m[1]} to the application, completing the pair at fidelity ${m[2]}`;
  }
  if (m = /^corrected (\S+) \(none\)$/.exec(a))
    return `found that ${m[1]} needed no correction`;
  if (m = /^corrected (\S+) \((\w+)\)$/.exec(a))
    return `corrected ${m[1]} with ${m[2].split("").join(" then ")}`;
  if (m = /^(\S+) is now (\S+) with (\S+)$/.exec(a))
    return `relabelled ${m[1]} as ${m[2]}, now shared with ${m[3]}`;
  if (m = /^discarded (\S+)$/.exec(a))
    return `discarded ${m[1]}`;
  if (m = /^(\S+) → (\S+)$/.exec(a))
    return `moved ${m[1]} to stage "${m[2]}"`;
  if ((m = /^(\w+) (.+)$/.exec(a)) && GATES.has(m[1])) {
    const on = m[2].split("\u2192");
    if (on.length === 2)
      return m[1] === "cnot" ? `applied cnot from ${on[0]} onto ${on[1]}` : `applied ${m[1]} to ${on[0]} and ${on[1]}`;
    return `applied ${m[1]} to ${m[2]}`;
  }
  return a;
}
function fireClause(f) {
  const did = f.actions.map(plainAction);
  const logs = f.log.map((l) => `logged "${l}"`);
  const all = [...did, ...logs];
  return all.length ? `${f.node} ran ${f.rule}, which ${andList(all)}` : `${f.node} ran ${f.rule}, which did nothing`;
}
function cause(ev) {
  const base = ev.summary.split("; fired ")[0];
  if (ev.type === "herald") {
    const id2 = ev.pair ?? "";
    const link = id2.includes("#") ? id2.slice(0, id2.indexOf("#")) : "";
    const ends = link.split("~");
    const f = /\(F ([0-9.]+)\)/.exec(base);
    const between = ends.length === 2 ? `the ${ends[0]}\u2013${ends[1]} link` : "a link";
    return `${between} produced pair ${short(id2)}${f ? ` with fidelity ${f[1]}` : ""}`;
  }
  if (ev.type === "arrive") {
    const m2 = /^(\S+) got (\S+) from (\S+)(?: about (\S+))?/.exec(base);
    if (m2)
      return `a "${m2[2]}" message from ${m2[3]} reached ${m2[1]}${m2[4] ? ` about pair ${m2[4]}` : ""}`;
    return `a message reached ${ev.node}`;
  }
  const m = /^\S+ woke \((.*)\)$/.exec(base);
  return `${ev.node} woke up${m ? ` (${m[1]})` : ""}`;
}
function lostClause(s) {
  return `the "${s.kind}" message from ${s.from} to ${s.to} was lost (${s.dropped})`;
}
function narrate(event) {
  if (event === null)
    return "Nothing has happened yet: the run is at its start, at time 0.";
  const parts = [`At ${formatDuration(event.time)}, ${cause(event)}`];
  if (event.fires.length === 0) {
    parts[0] += event.type === "arrive" ? ", and no rule could use it yet, so it waits in the inbox" : ", and no rule fired";
  } else {
    parts[0] += `; then ${event.fires.map(fireClause).join("; then ")}`;
  }
  const lost = event.sends.filter((s) => s.dropped);
  if (lost.length)
    parts.push(andList(lost.map(lostClause)));
  return `${parts.join("; ")}.`;
}

// dist/tui/lines.js
function lineText(l) {
  return l.map((s) => s.text).join("");
}
function fitLine(l, w) {
  const out = [];
  let used = 0;
  const total = width(lineText(l));
  if (total <= w)
    return l;
  for (const s of l) {
    const room = w - used;
    if (room <= 0)
      break;
    const sw = width(s.text);
    if (sw < room) {
      out.push(s);
      used += sw;
    } else {
      out.push({ text: fit(s.text + "  ", room), tone: s.tone });
      used = w;
    }
  }
  return out;
}

// dist/tui/views/events.js
function eventsView(inp, cols, rows2) {
  const lines = [];
  if (inp.narration !== void 0) {
    const said = wrap(inp.narration, cols - 2, "");
    const keep = Math.max(1, Math.min(3, rows2 - 2));
    said.slice(0, keep).forEach((l, i) => {
      const last = i === keep - 1 && said.length > keep;
      lines.push([{ text: `${i === 0 ? "\xBB " : "  "}${last ? fit(`${l} \u2026`, cols - 2) : l}`, tone: "strong" }]);
    });
  }
  const room = rows2 - lines.length;
  const total = inp.records.length;
  if (room <= 0)
    return lines;
  if (total === 0) {
    lines.push([{ text: "no events yet: press \u2192 to step", tone: "dim" }]);
    return lines;
  }
  const sel = Math.min(Math.max(0, inp.selected), total - 1);
  const end = Math.min(total - 1, Math.max(sel + 1, room - 1));
  const start = Math.max(0, Math.min(sel, end - room + 1));
  const idxW = String(total - 1).length + 1;
  for (let i = start; i <= Math.min(total - 1, start + room - 1); i++) {
    const r = inp.records[i];
    const atCursor = i === inp.cursor - 1;
    const ahead = i >= inp.cursor;
    const isSel = inp.focused && i === sel;
    const mark = { text: atCursor ? "\u25B6 " : isSel ? "\u25B8 " : "  ", tone: isSel ? "select" : atCursor ? "accent" : "plain" };
    const head = `${pad(`#${r.index}`, idWSafe(idxW))} ${padLeft(formatDuration(r.time_ns), 10)}  `;
    const tone = isSel ? "select" : atCursor ? "strong" : ahead ? "dim" : "plain";
    lines.push([mark, { text: fit(head + r.summary, cols - 2), tone }]);
  }
  return lines;
}
function idWSafe(n) {
  return Math.max(3, n);
}

// dist/tui/views/timeline.js
var TIMELINE_MARKS = [
  { mark: "+", meaning: "new pair (both ends)", tone: "good" },
  { mark: "X", meaning: "swap (Bell-state measurement)", tone: "accent" },
  { mark: "P", meaning: "purification step (two-qubit gate, then a measurement)", tone: "warn" },
  { mark: "D", meaning: "delivery", tone: "good" },
  { mark: "x", meaning: "discard", tone: "bad" },
  { mark: "*", meaning: "another rule fired", tone: "strong" },
  { mark: "o", meaning: "a message arrived and no rule fired", tone: "dim" },
  { mark: "~", meaning: "a wake-up and no rule fired", tone: "dim" },
  { mark: "\\ /", meaning: "a message on its way (time goes down)", tone: "plain" },
  { mark: "> <", meaning: "a message arriving", tone: "plain" }
];
var TONE = new Map(TIMELINE_MARKS.map((m) => [m.mark, m.tone]));
var RANK = ["X", "P", "D", "x", "*", "+", "o", "~"];
function fireMark(f) {
  const a = f.actions;
  if (a.some((s) => s.startsWith("Bell-measured")))
    return "X";
  if (a.some((s) => /^(cnot|cz) /.test(s)) && a.some((s) => s.startsWith("measured")))
    return "P";
  if (a.some((s) => s.startsWith("delivered")))
    return "D";
  if (a.some((s) => s.startsWith("discarded")))
    return "x";
  return "*";
}
function better(a, b) {
  return a === void 0 || RANK.indexOf(b) < RANK.indexOf(a) ? b : a;
}
function eventMarks(ev) {
  const marks = /* @__PURE__ */ new Map();
  if (ev.type === "herald" && ev.pair) {
    const link = ev.pair.slice(0, ev.pair.indexOf("#"));
    for (const end of link.split("~"))
      marks.set(end, "+");
  }
  for (const f of ev.fires)
    marks.set(f.node, better(marks.get(f.node), fireMark(f)));
  if (!marks.has(ev.node))
    marks.set(ev.node, ev.type === "arrive" ? "o" : ev.type === "wake" ? "~" : "+");
  return marks;
}
var LOOKBACK = 512;
function timelineView(inp, cols, rows2) {
  const sites = chainOrder(inp.net) ?? [...inp.net.nodeIds];
  const labelW = 11;
  const room = Math.max(3, cols - labelW);
  const cw = Math.max(3, Math.min(9, Math.floor(room / sites.length)));
  const fits = Math.max(1, Math.floor(room / cw));
  const sel = Math.max(0, sites.indexOf(inp.site));
  const first = sites.length <= fits ? 0 : Math.max(0, Math.min(sites.length - fits, sel - Math.floor(fits / 2)));
  const shown = sites.slice(first, first + fits);
  const colOf = new Map(shown.map((s, i) => [s, i * cw + Math.floor(cw / 2)]));
  const gridW = shown.length * cw;
  const header = [{ text: " ".repeat(labelW), tone: "plain" }];
  for (const s of shown) {
    const name = fit(s, cw - 1);
    const left = Math.floor((cw - name.length) / 2);
    header.push({ text: " ".repeat(left), tone: "plain" }, { text: name, tone: s === inp.site ? "select" : "strong" }, { text: " ".repeat(cw - left - name.length), tone: "plain" });
  }
  const lines = [header];
  if (inp.cursor === 0) {
    lines.push([{ text: "no events yet: press \u2192 to step", tone: "dim" }]);
    return lines;
  }
  const end = Math.max(0, inp.cursor - 1 - inp.back);
  const start = Math.max(0, end - (rows2 - 2));
  const flights = /* @__PURE__ */ new Map();
  const arrivedAt = /* @__PURE__ */ new Map();
  const take = (ev, i) => {
    for (const s of ev.sends)
      if (!s.dropped)
        flights.set(s.id, { from: s.from, to: s.to, sent: s.sent, arrives: s.arrives, sentAt: i });
  };
  for (let i = start; i <= end; i++) {
    const ev = inp.log.get(i);
    if (!ev)
      continue;
    take(ev, i);
    if (ev.message)
      arrivedAt.set(ev.message, i);
  }
  let missing = [...arrivedAt.keys()].filter((id2) => !flights.has(id2)).length;
  for (let i = start - 1; i >= Math.max(0, start - LOOKBACK) && missing > 0; i--) {
    const ev = inp.log.get(i);
    if (!ev)
      continue;
    for (const snd of ev.sends)
      if (arrivedAt.has(snd.id) && !flights.has(snd.id))
        missing--;
    take(ev, i);
  }
  if (inp.back === 0) {
    for (const m of Object.values(inp.world.inflight)) {
      if (!flights.has(m.id))
        flights.set(m.id, { from: m.from, to: m.to, sent: m.sent, arrives: m.arrives, sentAt: -1 });
    }
  }
  const tStart = inp.records[start]?.time_ns ?? 0;
  const live = [...flights.entries()].filter(([id2, f]) => {
    const arr = arrivedAt.get(id2);
    return arr === void 0 ? f.arrives >= tStart : arr > start;
  });
  let prevT = start > 0 ? inp.records[start - 1].time_ns : 0;
  for (let r = start; r <= end; r++) {
    const rec = inp.records[r];
    const t = rec.time_ns;
    const cells = new Array(gridW).fill(" ");
    const tones = new Array(gridW).fill("plain");
    for (const [s, x] of colOf) {
      cells[x] = "\u2502";
      tones[x] = s === inp.site ? "accent" : "dim";
    }
    for (const [id2, f] of live) {
      const arr = arrivedAt.get(id2);
      if (r <= f.sentAt || arr !== void 0 && r > arr)
        continue;
      if (f.sentAt < 0 && t < f.sent || arr === void 0 && t > f.arrives)
        continue;
      const xa = colPos(f.from, sites, first, cw);
      const xb = colPos(f.to, sites, first, cw);
      const dir = Math.sign(xb - xa);
      if (dir === 0)
        continue;
      const span = Math.max(1, f.arrives - f.sent);
      const frac = (row, time) => arr !== void 0 && f.sentAt >= 0 ? (row - f.sentAt) / (arr - f.sentAt) : Math.min(1, Math.max(0, (time - f.sent) / span));
      const x0 = Math.round(xa + (xb - xa) * frac(r - 1, prevT));
      const arriving = r === arr;
      const x1 = arriving ? xb - dir : Math.round(xa + (xb - xa) * frac(r, t));
      const from = x0 === x1 ? x1 : x0 + dir;
      for (let x = from; dir > 0 ? x <= x1 : x >= x1; x += dir) {
        if (x < 0 || x >= gridW || x === xb || x === xa)
          continue;
        cells[x] = x !== x1 ? "\u2500" : arriving ? dir > 0 ? ">" : "<" : dir > 0 ? "\\" : "/";
        tones[x] = "plain";
      }
    }
    const ev = inp.log.get(r);
    const marks = ev ? eventMarks(ev) : /* @__PURE__ */ new Map([[rec.node, rec.kind === "arrive" ? "o" : rec.kind === "wake" ? "~" : "+"]]);
    for (const [s, m] of marks) {
      const x = colOf.get(s);
      if (x === void 0)
        continue;
      cells[x] = m;
      tones[x] = TONE.get(m) ?? "strong";
    }
    const atCursor = r === inp.cursor - 1;
    const segs = [
      { text: atCursor ? "\u25B6" : " ", tone: atCursor ? "accent" : "plain" },
      { text: `${padLeft(formatDuration(t), labelW - 2)} `, tone: atCursor ? "select" : "dim" }
    ];
    for (let x = 0; x < gridW; x++) {
      const last = segs[segs.length - 1];
      if (x > 0 && last.tone === tones[x])
        segs[segs.length - 1] = { text: last.text + cells[x], tone: last.tone };
      else
        segs.push({ text: cells[x], tone: tones[x] });
    }
    lines.push(segs);
    prevT = t;
  }
  return lines;
}
function colPos(site, sites, first, cw) {
  return (sites.indexOf(site) - first) * cw + Math.floor(cw / 2);
}

// dist/tui/views/help.js
function rows(items, cols) {
  const lw = Math.min(Math.max(...items.map((i) => i.left.length)) + 2, Math.floor(cols / 2));
  const out = [];
  for (const it of items) {
    wrap(it.right, Math.max(10, cols - lw - 2)).forEach((l, i) => {
      out.push([
        { text: `  ${pad(i === 0 ? it.left : "", lw)}`, tone: i === 0 ? "strong" : "plain" },
        { text: l, tone: "plain" }
      ]);
    });
  }
  return out;
}
function helpLines(cols) {
  return [
    [{ text: "keys", tone: "title" }],
    ...rows(KEYS.map((k) => ({ left: k.label, right: k.does })), cols),
    [{ text: "", tone: "plain" }],
    [{ text: "commands (press : then type; Tab completes; a mistake is shown, never fatal)", tone: "title" }],
    ...rows(COMMANDS.map((c) => ({ left: `${c.word}${c.args ? ` ${c.args}` : ""}`, right: c.does })), cols),
    [{ text: "", tone: "plain" }],
    [{ text: "timeline marks (sites are columns, time goes down)", tone: "title" }],
    ...rows(TIMELINE_MARKS.map((m) => ({ left: m.mark, right: m.meaning })), cols),
    [{ text: "", tone: "plain" }],
    [{ text: "rules pane: \u2713 guard holds   \u2717 guard fails, with what it waits for   \xB7 not reached", tone: "plain" }],
    [{ text: "Esc, ? or q closes this help; \u2191 \u2193 PgUp PgDn scroll it", tone: "dim" }]
  ];
}
function listLines(session, cols) {
  const bps = session.breakpoints();
  const ws = session.watches();
  const out = [[{ text: bps.length ? `breakpoints (${bps.length})` : "no breakpoints: add one with  break on fire SITE.RULE  or  break EXPR", tone: "title" }]];
  for (const b of bps) {
    out.push(...wrap(`${b.id}  ${b.enabled ? "on " : "off"}  ${b.spec}   hit ${b.hits} time${b.hits === 1 ? "" : "s"}`, cols - 2, "       ").map((l) => [{ text: `  ${l}`, tone: b.enabled ? "plain" : "dim" }]));
  }
  out.push([{ text: "", tone: "plain" }], [{ text: ws.length ? `watches (${ws.length})` : "no watches: add one with  watch EXPR", tone: "title" }]);
  for (const w of ws) {
    const changed = w.changedAt !== void 0 ? `, changed at #${w.changedAt}` : "";
    out.push(...wrap(`${w.id}  ${w.spec} = ${w.error ? `? (${w.error})` : w.value}${changed}`, cols - 2, "     ").map((l) => [{ text: `  ${l}`, tone: w.error ? "bad" : "plain" }]));
  }
  out.push([{ text: "", tone: "plain" }], [{ text: "forget ID removes one, disable ID / enable ID switch a breakpoint; Esc closes", tone: "dim" }]);
  return out;
}

// dist/tui/views/messages.js
function messagesView(w, site, cols) {
  const lines = [];
  const flying = Object.values(w.inflight).sort((a, b) => a.arrives - b.arrives || String(a.id).localeCompare(String(b.id)));
  const push = (text, tone) => {
    for (const l of wrap(text, cols, "    "))
      lines.push([{ text: l, tone }]);
  };
  lines.push([{ text: flying.length ? `in flight (${flying.length})` : "nothing in flight", tone: "title" }]);
  for (const m of flying) {
    const about = m.pair ? ` about ${shortPairId(m.pair)}` : "";
    push(`${m.from} \u2192 ${m.to}  ${m.kind}${about}  arrives in ${formatDuration(m.arrives - w.time)}`, m.from === site || m.to === site ? "strong" : "plain");
  }
  let waiting = 0;
  for (const id2 of Object.keys(w.nodes).sort()) {
    const inbox = w.nodes[id2].inbox;
    if (inbox.length === 0)
      continue;
    waiting += inbox.length;
    lines.push([{ text: `unread at ${id2} (${inbox.length})`, tone: "title" }]);
    for (const m of inbox) {
      const about = m.pair ? ` about ${shortPairId(m.pair)}` : "";
      push(`${m.kind} from ${m.from}${about}, waiting ${formatDuration(w.time - m.arrives)}`, id2 === site ? "warn" : "plain");
    }
  }
  return { lines, note: `${flying.length} in flight${waiting ? `, ${waiting} unread` : ""}` };
}

// dist/tui/views/rules.js
var MARK = { holds: "\u2713", fails: "\u2717", unreached: "\xB7" };
function rulesView(reports, site, cols) {
  if (reports.length === 0)
    return { lines: [[{ text: `${site} runs no rules: it only holds what its links make`, tone: "dim" }]], note: "none" };
  const lines = [];
  const push = (text, lead, hang, tone) => {
    for (const l of wrap(text, cols - lead.length, hang))
      lines.push([{ text: lead + l, tone }]);
  };
  let ready = 0;
  for (const r of reports) {
    if (r.ready)
      ready++;
    const state = r.firedNow ? "\u2605 fired at this event" : r.ready ? r.busyUntil !== void 0 ? `ready once idle at ${formatDuration(r.busyUntil)}` : "ready" : "waits";
    lines.push([
      { text: r.rule, tone: "strong" },
      { text: `  ${state}`, tone: r.firedNow ? "accent" : r.ready ? "good" : "warn" }
    ]);
    if (r.busyUntil !== void 0 && !r.ready)
      push(`(site busy until ${formatDuration(r.busyUntil)})`, "  ", "", "dim");
    for (const g of r.guards) {
      const tone = g.state === "holds" ? "good" : g.state === "fails" ? "bad" : "dim";
      push(`${MARK[g.state]} ${g.text}${g.state === "unreached" ? " (not reached)" : ""}`, "  ", "  ", tone);
      if (g.state === "fails" && g.reason)
        push(`\u2192 ${g.reason}`, "    ", "  ", "plain");
    }
    for (const f of r.lint)
      push(`! check: ${f}`, "  ", "  ", "warn");
  }
  return { lines, note: `${ready}/${reports.length} ready` };
}

// dist/tui/views/status.js
var STOP_WORDS = {
  start: "at the start",
  event: "stepped",
  time: "jumped to a time",
  breakpoint: "stopped at a breakpoint",
  stall: "STALLED",
  idle: "finished",
  limit: "paused: no breakpoint hit yet"
};
function statusLine(session, autoplay, busy, cols) {
  const narrow = cols < 100;
  const w = session.world();
  const c = session.cursor;
  const bps = session.breakpoints();
  const off = bps.filter((b) => !b.enabled).length;
  const stop = session.stop;
  const ending = session.ending();
  const sep = { text: " \u2502 ", tone: "dim" };
  const segs = [];
  if (busy)
    segs.push({ text: `\u23F3 ${busy}`, tone: "warn" }, sep);
  else if (autoplay)
    segs.push({ text: autoplay.playing ? `\u25B6 playing ${autoplay.rate}/s` : "\u23F8 paused", tone: autoplay.playing ? "good" : "warn" }, sep);
  segs.push({ text: c === 0 ? narrow ? "start" : "at the start" : narrow ? `#${c - 1}` : `event #${c - 1}`, tone: "strong" }, { text: narrow ? `/${session.total}` : ` of ${session.total} computed`, tone: "plain" }, sep, { text: `${narrow ? "" : "t "}${formatDuration(w.time)}`, tone: "strong" }, sep, { text: `seed ${session.seed}`, tone: "plain" }, sep, { text: `${bps.length} break${bps.length === 1 ? "" : "s"}${off ? ` (${off} off)` : ""}`, tone: bps.length ? "accent" : "dim" }, sep);
  let word = STOP_WORDS[stop.reason] ?? stop.reason;
  let tone = stop.reason === "stall" ? "bad" : stop.reason === "breakpoint" ? "accent" : stop.reason === "idle" || stop.reason === "limit" ? "warn" : "plain";
  if (ending === "stall" && stop.reason !== "stall") {
    word = "STALLED here";
    tone = "bad";
  } else if (ending === "idle" && stop.reason !== "idle") {
    word = "the run ends here";
    tone = "warn";
  }
  const detail = stop.reason === "breakpoint" || stop.reason === "stall" || stop.reason === "idle" ? `: ${stop.detail}` : "";
  segs.push({ text: `${word}${detail}`, tone });
  return segs;
}

// dist/tui/frame.js
var NAMES = {
  network: "sites",
  pairs: "pairs",
  rules: "rules",
  messages: "messages",
  events: "events",
  timeline: "timeline"
};
function title(id2, site, focused, note, cols) {
  const name = id2 === "pairs" ? `pairs at ${site}` : id2 === "rules" ? `rules of ${site}` : NAMES[id2];
  const text = `${focused ? "\u25B6 " : "  "}${focused ? name.toUpperCase() : name}${note ? ` \xB7 ${note}` : ""} `;
  return fitLine([{ text, tone: focused ? "focus" : "title" }, { text: "\u2500".repeat(Math.max(0, cols - text.length)), tone: "dim" }], cols);
}
function windowAt(offset, anchor, h, len) {
  let o = offset;
  if (anchor !== void 0) {
    if (anchor < o)
      o = anchor;
    if (anchor >= o + h)
      o = anchor - h + 1;
  }
  return Math.max(0, Math.min(o, len - h));
}
var cache = /* @__PURE__ */ new WeakMap();
function paneModel(c, id2, width2, height) {
  const s = c.session;
  const net = s.engine.net;
  const rows2 = Math.max(0, height - 1);
  const focused = c.focus === id2;
  if (focused)
    c.pageRows = Math.max(1, rows2 - 1);
  const pane = id2 === "pairs" ? [...c.bellOpen].join(",") + `|${c.pairSel}` : id2 === "events" ? `${c.eventSel}|${s.total}|${c.autoplay !== null}` : "";
  const keyOf = () => `${s.cursor}|${c.site}|${focused}|${width2}x${height}|${c.scroll[id2]}|${pane}`;
  const key = keyOf();
  let byPane = cache.get(c);
  if (!byPane)
    cache.set(c, byPane = /* @__PURE__ */ new Map());
  const hit = byPane.get(id2);
  if (hit && hit.key === key)
    return hit.model;
  const w = s.world();
  let body;
  let note;
  if (id2 === "events") {
    const sel = c.eventSel ?? Math.max(0, s.cursor - 1);
    body = eventsView({ records: s.history.records, cursor: s.cursor, selected: sel, focused, narration: c.autoplay ? void 0 : narrate(s.event()) }, width2, rows2);
    note = `${s.total} computed`;
  } else if (id2 === "timeline") {
    body = timelineView({ net, world: w, records: s.history.records, log: c.log, cursor: s.cursor, site: c.site, back: c.scroll.timeline }, width2, rows2);
    note = c.scroll.timeline ? `${c.scroll.timeline} events back` : "time \u2193";
  } else {
    let v;
    if (id2 === "network")
      v = networkView(net, w, c.site, width2);
    else if (id2 === "pairs")
      v = pairsView(pairsAt(net, w, c.site), c.pairSel, c.bellOpen, width2, focused);
    else if (id2 === "rules")
      v = rulesView(s.explain(c.site), c.site, width2);
    else
      v = messagesView(w, c.site, width2);
    const off = windowAt(c.scroll[id2], v.anchor, rows2, v.lines.length);
    c.scroll[id2] = off;
    body = v.lines.slice(off, off + rows2);
    note = v.note;
    if (v.lines.length > rows2)
      note = `${note ? `${note} \xB7 ` : ""}${off + 1}\u2013${Math.min(v.lines.length, off + rows2)} of ${v.lines.length}`;
  }
  const model = { id: id2, width: width2, height, focused, title: title(id2, c.site, focused, note, width2), body: body.map((l) => fitLine(l, width2)) };
  byPane.set(id2, { key: keyOf(), model });
  return model;
}
function bottomRows(c, cols) {
  if (c.mode === "command") {
    const hint = c.command.hint;
    const lines = (hint?.lines ?? []).slice(0, 3).flatMap((l) => wrap(l, cols).slice(0, 2)).map((l) => [{ text: l, tone: hint.tone }]);
    lines.push([{ text: "\u203A ", tone: "accent" }, { text: c.command.text, tone: "strong" }, { text: "\u2588", tone: "plain" }]);
    return lines;
  }
  if (c.busy)
    return [[{ text: `${c.busy} \xB7 Esc stops \xB7 Ctrl+C quits`, tone: "warn" }]];
  if (c.note)
    return c.note.lines.slice(0, 2).map((l) => [{ text: l, tone: c.note.tone }]);
  return [[{ text: KEY_HINTS, tone: "dim" }]];
}
function topRows(c, cols) {
  const s = c.session;
  const top = [statusLine(s, c.autoplay, c.busy, cols)];
  if (c.autoplay) {
    const all = wrap(narrate(s.event()), cols - 3);
    const said = all.slice(0, 3);
    if (all.length > 3)
      said[2] = `${said[2]} \u2026`;
    for (const l of said)
      top.push([{ text: pad(` ${l}`, cols), tone: "select" }]);
  }
  const ws = s.watches().slice(0, 3);
  for (const w of ws) {
    const changed = w.changedAt !== void 0 ? ` \xB7 changed at #${w.changedAt}` : "";
    top.push([{ text: `watch ${w.id} `, tone: "accent" }, { text: `${w.spec} = ${w.error ? `? ${w.error}` : w.value}${changed}`, tone: w.error ? "bad" : "plain" }]);
  }
  return top;
}
function buildFrame(c, cols, termRows) {
  const rows2 = Math.max(4, termRows - 1);
  const top = topRows(c, cols).map((l) => fitLine(l, cols));
  const bottom = bottomRows(c, cols).map((l) => fitLine(l, cols));
  const bodyRows = Math.max(2, rows2 - top.length - bottom.length);
  if (c.mode === "help" || c.mode === "list") {
    const all = c.mode === "help" ? helpLines(cols) : listLines(c.session, cols);
    c.pageRows = Math.max(1, bodyRows - 1);
    c.overlayScroll = Math.max(0, Math.min(c.overlayScroll, all.length - bodyRows));
    return { cols, rows: rows2, top, columns: [], overlay: all.slice(c.overlayScroll, c.overlayScroll + bodyRows).map((l) => fitLine(l, cols)), bottom };
  }
  const lay = layout(cols, bodyRows, c.focus);
  const columns = lay.columns.map((col, i) => {
    const divider = i > 0;
    const inner = col.width - (divider ? 1 : 0);
    return { width: col.width, divider, panes: col.panes.map((p) => paneModel(c, p.id, inner, p.height)) };
  });
  return { cols, rows: rows2, top, columns, bottom };
}

// dist/tui/use-terminal-size.js
import { useStdout } from "ink";
import { useEffect, useState } from "react";
function useTerminalSize(fixed) {
  const { stdout } = useStdout();
  const read = () => ({ columns: stdout.columns || 80, rows: stdout.rows || 24 });
  const [size, setSize] = useState(read);
  useEffect(() => {
    if (fixed)
      return;
    const onResize = () => setSize(read());
    stdout.on("resize", onResize);
    return () => void stdout.off("resize", onResize);
  }, [stdout, fixed]);
  return fixed ?? size;
}

// dist/tui/app.js
function DebuggerApp({ controller, size }) {
  const { exit } = useApp();
  const { isRawModeSupported } = useStdin();
  const term = useTerminalSize(size);
  const [, setVersion] = useState2(controller.version);
  useEffect2(() => controller.subscribe(() => setVersion(controller.version)), [controller]);
  useEffect2(() => controller.onExit((error) => exit(error)), [controller, exit]);
  const latest = useRef(controller);
  latest.current = controller;
  const onKey = useCallback((input, key) => latest.current.handleKey(input, key), []);
  useInput(onKey, { isActive: isRawModeSupported === true });
  const playing = controller.autoplay?.playing === true;
  const rate = controller.autoplay?.rate ?? 1;
  useEffect2(() => {
    if (!playing)
      return;
    const timer = setInterval(() => controller.autoStep(), Math.max(10, 1e3 / rate));
    return () => clearInterval(timer);
  }, [controller, playing, rate]);
  return _jsx4(FrameView, { frame: buildFrame(controller, term.columns, term.rows), colour: controller.colour });
}

// dist/tui/start.js
import { jsx as _jsx5 } from "react/jsx-runtime";
import { render } from "ink";
var ALT_ON = "\x1B[?1049h\x1B[H\x1B[2J";
var ALT_OFF = "\x1B[?25h\x1B[?1049l";
var SIGNALS = { SIGTERM: 15, SIGHUP: 1 };
async function startDebugger(controller, io) {
  const out = io.stdout;
  let restored = false;
  const restore = () => {
    if (restored)
      return;
    restored = true;
    try {
      out.write(ALT_OFF);
    } catch {
    }
  };
  out.write(ALT_ON);
  const instance = render(_jsx5(DebuggerApp, { controller }), {
    stdin: io.stdin,
    stdout: out,
    stderr: io.stderr,
    exitOnCtrlC: false,
    patchConsole: false,
    // Ink 6.8's incremental mode draws every changed row one row too low after the first
    // frame (seen in tmux): the standard mode rewrites the frame, which at rows − 1 is cheap
    incrementalRendering: false,
    maxFps: 60
  });
  const onSignal = (sig) => {
    instance.unmount();
    restore();
    process.exit(128 + SIGNALS[sig]);
  };
  const handlers = Object.keys(SIGNALS).map((sig) => {
    const h = () => onSignal(sig);
    process.on(sig, h);
    return [sig, h];
  });
  process.on("exit", restore);
  const onResize = () => out.write("\x1B[2J");
  out.on("resize", onResize);
  try {
    await instance.waitUntilExit();
  } finally {
    out.off("resize", onResize);
    for (const [sig, h] of handlers)
      process.off(sig, h);
    instance.unmount();
    restore();
    process.off("exit", restore);
  }
}
export {
  COMMANDS,
  Controller,
  DebuggerApp,
  KEYS,
  startDebugger,
  wantsColour
};
