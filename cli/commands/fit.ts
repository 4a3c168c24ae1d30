/** `cli fit SAMPLES --tolerance E`: key reduction of dense samples to a hermite curve document. */
import { readFileSync } from 'node:fs';
import { basename, extname } from 'node:path';
import { fitResultToCurve, fitSamples, parseSamples } from '../../shared/convert';
import { parseCliArgs } from '../args';
import { CliError, type CliCommand } from '../types';

const USAGE = `Usage: npm run --silent cli -- fit SAMPLES --tolerance E [--name NAME]

SAMPLES      CSV (time,value per line; header optional; ',' ';' or tab) or JSON
             ([[t, v], ...] or [{"time": t, "value": v}, ...]); times strictly increasing
--tolerance  largest allowed |curve − samples| in value units (also checked between samples)
--name       curve name (default: the file name without extension)

Prints the fitted curve document (hermite keys) as JSON; its description gives the number of
keys and the maximum error reached. Exits 1 if the tolerance cannot be met.`;

const command: CliCommand = {
  name: 'fit',
  summary: 'fit a hermite curve with few keys to CSV/JSON samples within a tolerance',
  async run(argv) {
    const args = parseCliArgs(argv, { strings: ['tolerance', 'name'] }, USAGE);
    if (args.flags.has('help')) {
      process.stdout.write(`${USAGE}\n`);
      return 0;
    }
    if (args.positionals.length !== 1) throw new CliError(`fit needs exactly one SAMPLES file, got ${args.positionals.length}\n\n${USAGE}`, 2);
    const tolText = args.values.tolerance;
    if (tolText === undefined) throw new CliError(`fit needs --tolerance E\n\n${USAGE}`, 2);
    const tolerance = Number(tolText);
    if (tolText.trim() === '' || !(tolerance > 0) || !Number.isFinite(tolerance)) {
      throw new CliError(`--tolerance: must be a positive number, got "${tolText}"`, 2);
    }
    const file = args.positionals[0];
    let text: string;
    try {
      text = readFileSync(file, 'utf8');
    } catch (e) {
      throw new CliError(`${file}: cannot read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    }
    const parsed = parseSamples(text);
    if (!parsed.ok) throw new CliError(`${file}: ${parsed.error}`);
    const { times, values } = parsed.samples;
    const fit = fitSamples(times, values, tolerance);
    if (!fit.ok) {
      throw new CliError(`${file}: tolerance ${tolerance} not reached; the best fit found has max error ${fit.maxError.toExponential(3)} with ${fit.keys.length} keys`);
    }
    const name = args.values.name ?? basename(file, extname(file));
    const doc = fitResultToCurve(fit, {
      name,
      description: `Fitted to ${times.length} samples from ${basename(file)}: ${fit.keys.length} keys, max error ${fit.maxError.toExponential(3)} (tolerance ${tolerance}; at samples ${fit.maxErrorAtSamples.toExponential(3)}, between ${fit.maxErrorBetween.toExponential(3)})`,
    });
    process.stdout.write(`${JSON.stringify(doc, null, 2)}\n`);
    return 0;
  },
};
export default command;
