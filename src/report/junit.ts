/**
 * JUnit XML in the Apache Ant shape that CI systems read: every required attribute and
 * element of that schema, in its order, and text escaped so any expectation, signature or
 * message survives. The one place bellstep writes JUnit (replay, sweep and merge).
 */
import { hostname } from 'node:os';
import { xmlAttr, xmlText } from './xml.js';

export { xmlAttr, xmlText };

/** A failed or errored test case: `type` says what kind, `message` is one line, `text` the detail. */
export interface JunitProblem {
  readonly type: string;
  readonly message: string;
  readonly text: string;
}

/** One test case. */
export interface JunitCase {
  readonly name: string;
  readonly classname: string;
  readonly seconds: number;
  /** The check itself failed (an expectation, a stall, a divergence). */
  readonly failure?: JunitProblem;
  /** The test could not run as meant (a program error, a crash). */
  readonly error?: JunitProblem;
}

/** One test suite; its counts are derived from the cases. */
export interface JunitSuite {
  readonly name: string;
  /** The suite's package in the aggregated document (the schema requires one). */
  readonly package: string;
  readonly cases: readonly JunitCase[];
  readonly properties?: readonly (readonly [string, string])[];
  readonly seconds: number;
  /** When the suite ran; written as local time without a zone, as the schema asks. */
  readonly timestamp: Date;
  readonly hostname?: string;
  readonly systemOut?: string;
  readonly systemErr?: string;
}

/** `2026-12-02T10:00:00`: local time, no zone, no fraction (the schema's pattern). */
export function junitTimestamp(d: Date): string {
  const p = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}T${p(d.getHours())}:${p(d.getMinutes())}:${p(d.getSeconds())}`;
}

function seconds(s: number): string {
  return Number.isFinite(s) && s > 0 ? s.toFixed(3) : '0.000';
}

// xs:token collapses whitespace, and the schema wants names of at least one character
function token(s: string, fallback: string): string {
  const t = s.replace(/\s+/g, ' ').trim();
  return t.length ? t : fallback;
}

function problem(tag: 'failure' | 'error', p: JunitProblem): string {
  return `<${tag} message="${xmlAttr(p.message)}" type="${xmlAttr(token(p.type, tag))}">${xmlText(p.text)}</${tag}>`;
}

function testcase(c: JunitCase): string {
  const head = `<testcase name="${xmlAttr(token(c.name, 'unnamed'))}" classname="${xmlAttr(token(c.classname, 'bellstep'))}" time="${seconds(c.seconds)}"`;
  // the schema allows one of failure or error per case; an error is the graver
  const inner = c.error ? problem('error', c.error) : c.failure ? problem('failure', c.failure) : '';
  return inner ? `    ${head}>${inner}</testcase>` : `    ${head}/>`;
}

function suite(s: JunitSuite, id: number): string {
  const failures = s.cases.filter((c) => c.failure && !c.error).length;
  const errors = s.cases.filter((c) => c.error).length;
  const attrs = [
    ['name', token(s.name, 'bellstep')],
    ['tests', String(s.cases.length)],
    ['failures', String(failures)],
    ['errors', String(errors)],
    ['time', seconds(s.seconds)],
    ['timestamp', junitTimestamp(s.timestamp)],
    ['hostname', token(s.hostname ?? safeHostname(), 'localhost')],
    ['package', token(s.package, 'bellstep')],
    ['id', String(id)],
  ]
    .map(([k, v]) => `${k}="${xmlAttr(v)}"`)
    .join(' ');
  const props = (s.properties ?? []).filter(([k]) => k.trim().length > 0);
  const properties = props.length
    ? `    <properties>\n${props.map(([k, v]) => `      <property name="${xmlAttr(k.trim())}" value="${xmlAttr(v)}"/>`).join('\n')}\n    </properties>`
    : '    <properties/>';
  return [
    `  <testsuite ${attrs}>`,
    properties,
    ...s.cases.map(testcase),
    `    <system-out>${xmlText(s.systemOut ?? '')}</system-out>`,
    `    <system-err>${xmlText(s.systemErr ?? '')}</system-err>`,
    '  </testsuite>',
  ].join('\n');
}

function safeHostname(): string {
  try {
    return hostname();
  } catch {
    return 'localhost';
  }
}

/** A JUnit document: `<testsuites>` holding the suites, ids from 0. */
export function junitXml(suites: readonly JunitSuite[]): string {
  return `<?xml version="1.0" encoding="UTF-8"?>\n<testsuites>\n${suites.map(suite).join('\n')}\n</testsuites>\n`;
}
