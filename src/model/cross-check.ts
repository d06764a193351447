/** Checks that a noise model talks about the network of a program set. */
import { InputError, InputErrors } from './errors.js';
import { sortErrors } from './file-ctx.js';
import { didYouMean } from './suggest.js';
import type { NoiseModel, ProgramSet, SourcePos } from './types.js';
import { fieldName, SourceDoc, type Path } from './yaml-source.js';

/** Refuses noise entries for links or nodes the program set does not have, and faults naming unknown nodes. */
export function crossCheck(ps: ProgramSet, noise: NoiseModel): void {
  // The typed model keeps no key positions; the text it came from still has them.
  const src = noise.file && noise.text ? SourceDoc.parse(noise.file, noise.text) : undefined;
  const at = (path: Path, key?: string): SourcePos | undefined => {
    if (!src) return undefined;
    return key === undefined ? src.posAt(path) : src.keyPosAt(path, key);
  };
  const nodeIds = ps.nodes.map((n) => n.id);
  const linkIds = ps.links.map((l) => l.id);
  const errors: InputError[] = [];
  for (const id of Object.keys(noise.links)) {
    if (linkIds.includes(id)) continue;
    errors.push(
      InputError.at(at(['links'], id), {
        code: 'reference',
        field: fieldName(['links', id]),
        message: `unknown link "${id}"${didYouMean(id, linkIds)}: ${ps.file || 'the program set'} has ${linkIds.length ? linkIds.join(', ') : 'no links'}`,
        fix: 'key per-link settings by a link id of the program set (ends sorted)',
      }),
    );
  }
  for (const id of Object.keys(noise.nodes)) {
    if (nodeIds.includes(id)) continue;
    errors.push(
      InputError.at(at(['nodes'], id), {
        code: 'reference',
        field: fieldName(['nodes', id]),
        message: `unknown node "${id}"${didYouMean(id, nodeIds)}`,
        fix: 'key per-node settings by a node id of the program set',
      }),
    );
  }
  noise.faults.forEach((f, i) => {
    for (const end of ['from', 'to'] as const) {
      const id = f[end];
      if (id === undefined || nodeIds.includes(id)) continue;
      const path = ['faults', i, f.kind, end];
      errors.push(
        InputError.at(at(path) ?? f.pos, {
          code: 'reference',
          field: fieldName(path),
          message: `unknown node "${id}"${didYouMean(id, nodeIds)}`,
          fix: 'name a node of the program set, or leave the field out to match any node',
        }),
      );
    }
  });
  // The slowest message crosses every fiber of the network; its arrival must stay a whole
  // number of nanoseconds that a double holds exactly.
  const fiber = ps.links.reduce((sum, l) => sum + l.lengthM, 0);
  const c = noise.defaults.classical;
  const delays = noise.faults.reduce((sum, f) => sum + (f.kind === 'delay' ? f.byNs : 0), 0);
  const worst = (fiber / c.speedMPerS) * 1e9 + c.extraDelayNs + delays;
  if (!(worst <= Number.MAX_SAFE_INTEGER)) {
    const path = ['defaults', 'classical', 'speed'];
    errors.push(
      InputError.at(at(path), {
        code: 'unit',
        field: fieldName(path),
        message: `at this speed a message across the network's ${fiber / 1000} km of fiber would take longer than the simulation can count (about 104 days)`,
        fix: 'give a faster speed, e.g. "200000 km/s" (light in fiber)',
      }),
    );
  }
  if (errors.length > 0) throw new InputErrors(sortErrors(errors));
}
