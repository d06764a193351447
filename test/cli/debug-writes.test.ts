/**
 * The debugger's writes cannot hang it: a save to a pipe or a device is refused at once with
 * a message, a save to a folder likewise, and the session stays usable after either.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { processIo } from '../../src/cli/io.js';
import { writeRegularFile } from '../../src/cli/outputs.js';
import { runCommand } from '../../src/tui/commands.js';
import { SWAP_NET } from '../engine/scenarios.js';
import { controllerFor } from '../tui/helpers.js';

describe('the debugger writes only regular files', () => {
  const dir = mkdtempSync(join(tmpdir(), 'bellstep-writes-'));
  const io = processIo();
  const c = controllerFor(SWAP_NET, undefined, { writeFile: (p, t) => writeRegularFile(io, p, t) });

  it('refuses a pipe at once, and the session goes on', () => {
    const fifo = join(dir, 'pipe');
    execFileSync('mkfifo', [fifo]);
    const t0 = Date.now();
    const r = runCommand(c, `save ${fifo}`);
    expect(Date.now() - t0).toBeLessThan(1000);
    expect(r).toMatchObject({ ok: false });
    expect(r.ok ? '' : r.error).toMatch(/not a regular file \(a pipe or a device\)/);
    expect(runCommand(c, 'step 3')).toMatchObject({ ok: true });
    expect(c.session.cursor).toBe(3);
  });

  it('refuses a folder and a device, and writes a file', () => {
    expect(runCommand(c, `save ${dir}`)).toMatchObject({ ok: false, error: expect.stringMatching(/is a directory/) });
    expect(runCommand(c, 'save /dev/null')).toMatchObject({ ok: false, error: expect.stringMatching(/not a regular file/) });
    const file = join(dir, 'out.replay.json');
    expect(runCommand(c, `save ${file}`)).toMatchObject({ ok: true });
    expect(JSON.parse(readFileSync(file, 'utf8')).final.events).toBe(3);
  });
});
