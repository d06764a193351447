/**
 * The look of the space-time chart: one shape per kind of mark, so that it reads in grey
 * scale, and colours that only add to what the shapes say. Shapes are drawn once in the
 * SVG's `defs` and placed with `use`, which keeps a chart of thousands of marks small.
 */
import type { MarkKind } from './chart-data.js';

/** What the legend says for each mark, in the order it lists them. */
export const MARK_MEANINGS: readonly { readonly kind: MarkKind; readonly label: string }[] = [
  { kind: 'pair', label: 'link pair made (both ends)' },
  { kind: 'swap', label: 'Bell-state measurement' },
  { kind: 'measure', label: 'other measurement' },
  { kind: 'discard', label: 'discard' },
  { kind: 'deliver', label: 'delivery of a half' },
  { kind: 'fire', label: 'other rule fired' },
];

/** The stylesheet: every colour and stroke of the chart, by class. */
export const CHART_CSS = `
svg { font-family: 'DejaVu Sans', Verdana, Arial, sans-serif; }
.bg { fill: #fbfaf6; }
.title { font-size: 18px; font-weight: bold; fill: #23211c; }
.sub { font-size: 12px; fill: #5c574d; }
.note { font-size: 12px; fill: #8a4b00; font-style: italic; }
.legend { font-size: 11px; fill: #3b3830; }
.site { font-size: 13px; font-weight: bold; fill: #23211c; text-anchor: middle; }
.site-line { stroke: #bdb6a6; stroke-width: 1.2; }
.grid { stroke: #ebe6da; stroke-width: 1; }
.tick { font-size: 10px; fill: #6d685d; text-anchor: end; }
.bond { stroke: #2a7f8f; stroke-width: 1; stroke-dasharray: 1.5 2.5; }
.msg path { stroke: #36465f; stroke-width: 1.1; fill: none; }
.msg text { font-size: 9px; fill: #36465f; text-anchor: middle; paint-order: stroke; stroke: #fbfaf6; stroke-width: 3px; }
.msg.lost path { stroke: #a8321f; stroke-dasharray: 4 3; }
.msg.lost text { fill: #a8321f; }
.m-pair { fill: #fbfaf6; stroke: #2a7f8f; stroke-width: 1.6; }
.m-swap { fill: #6b3a93; stroke: #3d1f57; stroke-width: 0.8; }
.m-measure { fill: #c27c0e; stroke: #6e4500; stroke-width: 0.8; }
.m-discard { fill: none; stroke: #a8321f; stroke-width: 2.2; stroke-linecap: round; }
.m-deliver-ring { fill: #fbfaf6; stroke: #2d7a32; stroke-width: 1.6; }
.m-deliver-dot { fill: #2d7a32; }
.m-fire { fill: #6d685d; }
.count { font-size: 9px; fill: #3b3830; }
`;

/** The shapes, centred on 0,0, and the two arrow heads. */
export const CHART_DEFS = [
  '<marker id="head" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" markerHeight="7" markerUnits="userSpaceOnUse" orient="auto-start-reverse"><path d="M0,1 L10,5 L0,9 z" fill="#36465f"/></marker>',
  '<marker id="lost-end" viewBox="0 0 10 10" refX="5" refY="5" markerWidth="8" markerHeight="8" markerUnits="userSpaceOnUse" orient="auto"><path d="M1,1 L9,9 M9,1 L1,9" stroke="#a8321f" stroke-width="2"/></marker>',
  '<g id="pair"><circle class="m-pair" r="3.6"/></g>',
  '<g id="swap"><path class="m-swap" d="M0,-6 L6,0 L0,6 L-6,0 z"/></g>',
  '<g id="measure"><path class="m-measure" d="M0,-5.5 L5.2,4 L-5.2,4 z"/></g>',
  '<g id="discard"><path class="m-discard" d="M-4.5,-4.5 L4.5,4.5 M4.5,-4.5 L-4.5,4.5"/></g>',
  '<g id="deliver"><circle class="m-deliver-ring" r="5.6"/><circle class="m-deliver-dot" r="2.2"/></g>',
  '<g id="fire"><circle class="m-fire" r="2"/></g>',
].join('');
