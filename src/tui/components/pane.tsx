/** A pane: its title row and its visible rows, in a box of fixed size. */
import { Box } from 'ink';
import { memo } from 'react';
import type { PaneModel } from '../frame.js';
import { LineText } from './line-text.js';

export interface PaneProps {
  readonly pane: PaneModel;
  readonly colour: boolean;
}

/** Renders a pane model; an unchanged model (same object) is not re-rendered. */
export const Pane = memo(function Pane({ pane, colour }: PaneProps) {
  return (
    <Box flexDirection="column" width={pane.width} height={pane.height}>
      <LineText line={pane.title} colour={colour} />
      {pane.body.map((l, i) => (
        <LineText key={i} line={l} colour={colour} />
      ))}
    </Box>
  );
});
