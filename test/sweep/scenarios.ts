/**
 * Scenarios of our own for sweep tests and the sweep benchmark, written as the YAML a user
 * would write so every run goes through the real loader.
 */

/**
 * A one-message handshake over a lossy classical channel with no cut-off: kiln delivers its
 * half and sends "ready"; weir delivers its half when the message comes. When the message is
 * lost, weir's only slot stays full for ever and the run stalls, so only some seeds fail, and
 * they all fail the same way.
 */
export const LOSSY_NET = `format: bellstep/program-set@1
title: handshake over a lossy channel without a cut-off
nodes:
  - {id: kiln, qubits: 1}
  - {id: weir, qubits: 1}
links:
  - {ends: [kiln, weir], length: 2 km, slots: 1}
programs:
  kiln:
    rules:
      - name: announce
        when:
          - have: {partner: weir, as: p}
        do:
          - send: {to: weir, kind: ready, pair: p.id}
          - deliver: p
  weir:
    rules:
      - name: accept
        when:
          - got: {from: kiln, kind: ready, as: m}
          - have: {id: m.pair, as: p}
        do:
          - deliver: p
`;

/** Noise for LOSSY_NET: 2 % of messages are lost. */
export const LOSSY_NOISE = `format: bellstep/noise@1
seed: 1
defaults:
  link:
    pair: {werner: 0.95}
    success: 0.2
  memory: {t2: 50 ms}
  classical: {loss: 0.02}
`;

/** A program that errs at run time: kiln's rule needs nothing and consumes nothing, so it loops. */
export const LOOPING_NET = `format: bellstep/program-set@1
title: a rule that never stops firing
nodes:
  - {id: kiln, qubits: 1}
  - {id: weir, qubits: 1}
links:
  - {ends: [kiln, weir], length: 1 km, slots: 1}
programs:
  kiln:
    rules:
      - name: spin
        when:
          - have: {partner: weir, as: p}
        do:
          - log: "still {p.id}"
`;
