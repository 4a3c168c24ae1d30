/** `cli eval INPUT --at T1,T2,…`: values of every curve of INPUT at the given times, as JSON. */
import { evaluate, prepareCurve } from '../../shared/curve';
import { evaluateCssEasing } from '../../shared/convert';
import { parseCliArgs } from '../args';
import { loadInput } from '../inputs';
import { CliError, type CliCommand } from '../types';

const USAGE = `Usage: npm run --silent cli -- eval INPUT --at T1,T2,...

INPUT   a curve-document JSON file (one document or {"curves": [...]}), a .gltf/.glb file,
        or a CSS easing function such as "ease-in-out", "steps(4, jump-none)", "linear(0, 0.25 75%, 1)"
--at    comma-separated times in seconds (for a CSS easing: input progress)

Prints {"curves":[{"name": ..., "values": [...]}]}. A CSS easing is evaluated by the W3C
specification, including outside [0, 1].`;

/** Parse "0,0.25,-1" into numbers; an error names the bad item. */
export function parseTimes(text: string): number[] {
  const parts = text.split(',');
  return parts.map((p, i) => {
    const s = p.trim();
    const v = Number(s);
    if (s === '' || !Number.isFinite(v)) throw new CliError(`--at: item ${i + 1} ("${p}") is not a finite number`, 2);
    return v;
  });
}

const command: CliCommand = {
  name: 'eval',
  summary: 'evaluate curves (curve JSON, .gltf/.glb, or a CSS easing) at given times',
  async run(argv) {
    const args = parseCliArgs(argv, { strings: ['at'] }, USAGE);
    if (args.flags.has('help')) {
      process.stdout.write(`${USAGE}\n`);
      return 0;
    }
    if (args.positionals.length !== 1) throw new CliError(`eval needs exactly one INPUT, got ${args.positionals.length}\n\n${USAGE}`, 2);
    if (args.values.at === undefined) throw new CliError(`eval needs --at T1,T2,...\n\n${USAGE}`, 2);
    const times = parseTimes(args.values.at);
    const input = loadInput(args.positionals[0]);
    let curves: { name: string; values: number[] }[];
    if (input.kind === 'css') {
      curves = [{ name: input.name, values: times.map((t) => evaluateCssEasing(input.easing, t)) }];
    } else {
      for (const w of input.warnings) process.stderr.write(`warning: ${w}\n`);
      curves = input.curves.map((doc) => {
        const c = prepareCurve(doc);
        return { name: doc.name, values: times.map((t) => evaluate(c, t)) };
      });
    }
    process.stdout.write(`${JSON.stringify({ curves })}\n`);
    return 0;
  },
};
export default command;
