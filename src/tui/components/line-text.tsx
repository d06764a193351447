/** One line of a pane as Ink text, each segment styled by its tone. */
import { Text } from 'ink';
import { memo } from 'react';
import type { Line } from '../lines.js';
import { toneProps } from '../style.js';

export interface LineTextProps {
  readonly line: Line;
  readonly colour: boolean;
}

/** A line of segments, cut (never wrapped) at the pane's edge. */
export const LineText = memo(function LineText({ line, colour }: LineTextProps) {
  if (line.length === 0) return <Text> </Text>;
  return (
    <Text wrap="truncate-end">
      {line.map((s, i) => (
        <Text key={i} {...toneProps(s.tone, colour)}>
          {s.text === '' ? ' ' : s.text}
        </Text>
      ))}
    </Text>
  );
});
