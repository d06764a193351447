/**
 * Program sets for benchmarks: a nested-swapping repeater chain of 2^L + 1 sites. Site i
 * swaps at level tz(i) (trailing zeros), joining its pairs with i − 2^l and i + 2^l; the
 * right-hand end of each swap applies the correction; the two chain ends deliver.
 */

function name(i: number): string {
  return `s${i}`;
}

function trailingZeros(i: number): number {
  let k = 0;
  while (i % 2 === 0) {
    i /= 2;
    k++;
  }
  return k;
}

/** The YAML of a nested-swapping chain with 2^levels + 1 sites, `km` of fiber per hop. */
export function nestedChain(levels: number, km = 5): string {
  const n = 2 ** levels + 1;
  const last = n - 1;
  const lines: string[] = ['format: bellstep/program-set@1', `title: nested-swapping chain of ${n} sites`, 'nodes:'];
  for (let i = 0; i < n; i++) lines.push(`  - {id: ${name(i)}, qubits: ${i === 0 || i === last ? 1 : 2}}`);
  lines.push('links:');
  for (let i = 0; i < last; i++) lines.push(`  - {ends: [${name(i)}, ${name(i + 1)}], length: ${km} km, slots: 1}`);
  lines.push('programs:');
  for (let i = 0; i < n; i++) {
    lines.push(`  ${name(i)}:`, '    rules:');
    // every site takes in the result of a swap that made it an end of a longer pair
    lines.push(
      '      - name: take',
      '        when:',
      '          - got: {kind: swapped, as: m}',
      '          - have: {id: m.pair, as: p}',
      '        do:',
      '          - correct: {pair: p, x: "m.fix == 1 && m.x == 1", z: "m.fix == 1 && m.z == 1"}',
      '          - rebind: {pair: p, partner: m.peer, id: m.joined}',
    );
    if (i === 0 || i === last) {
      const far = i === 0 ? name(last) : name(0);
      lines.push('      - name: hand-over', `        when: [{have: {partner: ${far}, as: p}}]`, '        do: [{deliver: p}]');
      continue;
    }
    const span = 2 ** trailingZeros(i);
    const left = name(i - span);
    const right = name(i + span);
    lines.push(
      '      - name: swap',
      '        when:',
      `          - have: {partner: ${left}, as: a}`,
      `          - have: {partner: ${right}, as: b}`,
      '        do:',
      '          - bell_measure: {on: [a, b], as: [zb, xb]}',
      `          - send: {to: ${right}, kind: swapped, pair: b.id, data: {fix: 1, z: zb, x: xb, peer: ${left}, joined: "join(a.id, b.id)"}}`,
      `          - send: {to: ${left}, kind: swapped, pair: a.id, data: {fix: 0, z: zb, x: xb, peer: ${right}, joined: "join(a.id, b.id)"}}`,
    );
  }
  return lines.join('\n') + '\n';
}

/**
 * The same chain written with roles: one `relabel` role for every site, an `end` role for
 * the two ends and a `repeater` role for the rest. It expands to exactly the rules of
 * `nestedChain`, in a file a few lines per site long, which is how a large network is written.
 */
export function nestedChainWithRoles(levels: number, km = 5): string {
  const n = 2 ** levels + 1;
  const last = n - 1;
  const lines: string[] = ['format: bellstep/program-set@1', `title: nested-swapping chain of ${n} sites`, 'nodes:'];
  for (let i = 0; i < n; i++) lines.push(`  - {id: ${name(i)}, qubits: ${i === 0 || i === last ? 1 : 2}}`);
  lines.push('links:');
  for (let i = 0; i < last; i++) lines.push(`  - {ends: [${name(i)}, ${name(i + 1)}], length: ${km} km, slots: 1}`);
  lines.push(
    'roles:',
    '  relabel:',
    '    rules:',
    '      - name: take',
    '        when:',
    '          - got: {kind: swapped, as: m}',
    '          - have: {id: m.pair, as: p}',
    '        do:',
    '          - correct: {pair: p, x: "m.fix == 1 && m.x == 1", z: "m.fix == 1 && m.z == 1"}',
    '          - rebind: {pair: p, partner: m.peer, id: m.joined}',
    '  end:',
    '    params: [far]',
    '    rules:',
    '      - name: hand-over',
    '        when: [{have: {partner: far, as: p}}]',
    '        do: [{deliver: p}]',
    '  repeater:',
    '    params: [left, right]',
    '    rules:',
    '      - name: swap',
    '        when:',
    '          - have: {partner: left, as: a}',
    '          - have: {partner: right, as: b}',
    '        do:',
    '          - bell_measure: {on: [a, b], as: [zb, xb]}',
    '          - send: {to: right, kind: swapped, pair: b.id, data: {fix: 1, z: zb, x: xb, peer: left, joined: "join(a.id, b.id)"}}',
    '          - send: {to: left, kind: swapped, pair: a.id, data: {fix: 0, z: zb, x: xb, peer: right, joined: "join(a.id, b.id)"}}',
    'programs:',
  );
  for (let i = 0; i < n; i++) {
    if (i === 0 || i === last) {
      lines.push(`  ${name(i)}: {use: [relabel, {role: end, args: {far: ${i === 0 ? name(last) : name(0)}}}]}`);
      continue;
    }
    const span = 2 ** trailingZeros(i);
    lines.push(`  ${name(i)}: {use: [relabel, {role: repeater, args: {left: ${name(i - span)}, right: ${name(i + span)}}}]}`);
  }
  return lines.join('\n') + '\n';
}

/** Noise for benchmark chains: noisy links and memories, so the density matrices do real work. */
export const CHAIN_NOISE = `format: bellstep/noise@1
seed: 5
defaults:
  link: {pair: {werner: 0.97}, success: 0.2}
  memory: {t1: 5 s, t2: 1 s}
  gates:
    single: {depolarizing: 0.0005, duration: 1 us}
    two: {depolarizing: 0.002, duration: 20 us}
    measure: {flip: 0.005, duration: 5 us}
`;
