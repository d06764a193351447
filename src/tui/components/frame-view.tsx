/** The whole screen from a frame model: status rows, the pane columns or an overlay, and the bottom rows. */
import { Box } from 'ink';
import type { FrameModel } from '../frame.js';
import { LineText } from './line-text.js';
import { Pane } from './pane.js';

export interface FrameViewProps {
  readonly frame: FrameModel;
  readonly colour: boolean;
}

/** Renders a frame exactly `frame.rows` tall. */
export function FrameView({ frame, colour }: FrameViewProps) {
  const body = frame.rows - frame.top.length - frame.bottom.length;
  return (
    <Box flexDirection="column" width={frame.cols} height={frame.rows}>
      {frame.top.map((l, i) => (
        <LineText key={`t${i}`} line={l} colour={colour} />
      ))}
      {frame.overlay ? (
        <Box flexDirection="column" height={body}>
          {frame.overlay.map((l, i) => (
            <LineText key={`o${i}`} line={l} colour={colour} />
          ))}
        </Box>
      ) : (
        <Box flexDirection="row" height={body}>
          {frame.columns.map((col, i) => (
            <Box
              key={i}
              flexDirection="column"
              width={col.width}
              height={body}
             
              borderStyle={col.divider ? 'single' : undefined}
              borderTop={false}
              borderRight={false}
              borderBottom={false}
              borderLeft={col.divider}
              borderDimColor
            >
              {col.panes.map((p) => (
                <Pane key={p.id} pane={p} colour={colour} />
              ))}
            </Box>
          ))}
        </Box>
      )}
      {frame.bottom.map((l, i) => (
        <LineText key={`b${i}`} line={l} colour={colour} />
      ))}
    </Box>
  );
}
