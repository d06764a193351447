/**
 * Runs the compiled CLI given as the first argument with the rest of the arguments, and
 * reports on stderr the process's peak resident memory (`max-rss-kb=N`) as it exits: how
 * the benchmarks read a whole `bellstep` process's memory without any outside tool.
 */
import { pathToFileURL } from 'node:url';

const [bin, ...args] = process.argv.slice(2);
process.argv = [process.argv[0], bin, ...args];
process.on('exit', () => {
  process.stderr.write(`max-rss-kb=${process.resourceUsage().maxRSS}\n`);
});
await import(pathToFileURL(bin).href);
