/**
 * Small scenarios of our own for the engine tests, written as the YAML a user would write,
 * so every test goes through the real loader.
 */
import { loadInputs } from '../../src/model/index.js';
import { Engine } from '../../src/engine/index.js';

/** An engine from inline program-set and noise-model text. */
export function engineFrom(net: string, noise?: string, seed?: number): Engine {
  const { programSet, noise: model } = loadInputs({ netFile: 'test.net.yaml', netText: net, noiseFile: noise ? 'test.noise.yaml' : undefined, noiseText: noise, seed });
  return new Engine(programSet, model);
}

/** Ideal noise except for the link pair state; `extra` is appended under `defaults:`. */
export function noiseWith(pair: string, extra = '', seed = 11): string {
  return `format: bellstep/noise@1
seed: ${seed}
defaults:
  link:
    pair: ${pair}
${extra}`;
}

/**
 * Two-site recurrence purification between kiln and weir: kiln CNOTs its older pair onto
 * the newer, measures the newer and sends the bit; weir does the same on the same two pairs
 * (named by id in the message) and answers whether the bits agree; both keep or discard.
 * With `dejmps`, kiln rotates both halves by Rx(π/2) and weir by Rx(−π/2) first.
 */
export function purificationNet(opts: { dejmps?: boolean; lengthKm?: number } = {}): string {
  const rot = (angle: string, a: string, b: string) =>
    opts.dejmps
      ? `          - gate: {op: rx, on: ${a}, angle: "${angle}"}
          - gate: {op: rx, on: ${b}, angle: "${angle}"}
`
      : '';
  return `format: bellstep/program-set@1
title: two-site purification
nodes:
  - {id: kiln, qubits: 2}
  - {id: weir, qubits: 2}
links:
  - {ends: [kiln, weir], length: ${opts.lengthKm ?? 4} km, slots: 2}
programs:
  kiln:
    rules:
      - name: start
        when:
          - have: {partner: weir, count: 2, as: [keep, probe]}
        do:
${rot('3.141592653589793 / 2', 'keep', 'probe')}          - gate: {op: cnot, on: [keep, probe]}
          - measure: {on: probe, basis: z, as: b}
          - stage: {pair: keep, to: waiting}
          - send: {to: weir, kind: parity, pair: keep.id, data: {bit: b, probe: probe.id}}
      - name: conclude
        when:
          - got: {from: weir, kind: verdict, as: v}
          - have: {id: v.pair, stage: waiting, as: keep}
        do:
          - if: "v.ok"
            then: [{deliver: keep}]
            else: [{discard: keep}]
  weir:
    rules:
      - name: answer
        when:
          - got: {from: kiln, kind: parity, as: m}
          - have: {id: m.pair, as: keep}
          - have: {id: m.probe, as: probe}
        do:
${rot('-3.141592653589793 / 2', 'keep', 'probe')}          - gate: {op: cnot, on: [keep, probe]}
          - measure: {on: probe, basis: z, as: b}
          - send: {to: kiln, kind: verdict, pair: keep.id, data: {ok: "b == m.bit"}}
          - if: "b == m.bit"
            then: [{deliver: keep}]
            else: [{discard: keep}]
`;
}

/** quay — mill — ridge; mill swaps, ridge corrects, both ends deliver. */
export const SWAP_NET = `format: bellstep/program-set@1
title: three-site swap
nodes:
  - {id: quay, qubits: 1}
  - {id: mill, qubits: 2}
  - {id: ridge, qubits: 1}
links:
  - {ends: [mill, quay], length: 10 km, slots: 1}
  - {ends: [mill, ridge], length: 14 km, slots: 1}
programs:
  mill:
    rules:
      - name: swap
        when:
          - have: {partner: quay, as: a}
          - have: {partner: ridge, as: b}
        do:
          - bell_measure: {on: [a, b], as: [zb, xb]}
          - send: {to: ridge, kind: swapped, pair: b.id, data: {z: zb, x: xb, peer: quay, joined: "join(a.id, b.id)"}}
          - send: {to: quay, kind: swapped, pair: a.id, data: {peer: ridge, joined: "join(a.id, b.id)"}}
  ridge:
    rules:
      - name: fix-up
        when:
          - got: {from: mill, kind: swapped, as: m}
          - have: {id: m.pair, as: p}
        do:
          - correct: {pair: p, x: m.x, z: m.z}
          - rebind: {pair: p, partner: m.peer, id: m.joined}
          - deliver: p
  quay:
    rules:
      - name: relabel
        when:
          - got: {from: mill, kind: swapped, as: m}
          - have: {id: m.pair, as: p}
        do:
          - rebind: {pair: p, partner: m.peer, id: m.joined}
          - deliver: p
`;

/**
 * Purification where the two ends choose their kept pair on their own: kiln keeps the
 * oldest, weir the newest. Their parity messages name different pairs, so neither end
 * ever concludes: a stall.
 */
export const DISAGREE_NET = `format: bellstep/program-set@1
title: purification that stalls
nodes:
  - {id: kiln, qubits: 2}
  - {id: weir, qubits: 2}
links:
  - {ends: [kiln, weir], length: 4 km, slots: 2}
programs:
  kiln:
    rules:
      - name: start
        when:
          - have: {partner: weir, count: 2, pick: oldest, as: [keep, probe]}
        do:
          - gate: {op: cnot, on: [keep, probe]}
          - measure: {on: probe, as: b}
          - stage: {pair: keep, to: waiting}
          - send: {to: weir, kind: parity, pair: keep.id, data: {bit: b}}
      - name: conclude
        when:
          - have: {partner: weir, stage: waiting, as: keep}
          - got: {from: weir, kind: parity, as: m}
          - check: "m.pair == keep.id"
        do:
          - deliver: keep
  weir:
    rules:
      - name: start
        when:
          - have: {partner: kiln, count: 2, pick: newest, as: [keep, probe]}
        do:
          - gate: {op: cnot, on: [keep, probe]}
          - measure: {on: probe, as: b}
          - stage: {pair: keep, to: waiting}
          - send: {to: kiln, kind: parity, pair: keep.id, data: {bit: b}}
      - name: conclude
        when:
          - have: {partner: kiln, stage: waiting, as: keep}
          - got: {from: kiln, kind: parity, as: m}
          - check: "m.pair == keep.id"
        do:
          - deliver: keep
`;
