// npm run calc -- <study.json> [--json] [--limits limit-set.json]
// npm run calc -- --schema
import { readFileSync } from 'node:fs';
import { calculateStudy, evaluateCompliance, CalculationError } from '../src/lib/calc';
import { describeIssues, studyJsonSchema, studySchema } from '../src/lib/schemas/study.schema';
import { limitSetSchema } from '../src/lib/schemas/limit-set.schema';
import { formatSummary } from './calc-summary';

const DEFAULT_LIMITS = 'tests/fixtures/limit-sets/demo-owner.json';

/** A problem with the command's input: one line on stderr, exit 1, no stack trace. */
class InputProblem extends Error {}

/** Reads and parses a JSON file, turning every way it can fail into one line naming the file. */
function readJson(file: string, what: string): unknown {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a directory' : code === 'EACCES' ? 'permission denied' : (err as Error).message;
    throw new InputProblem(`Cannot read the ${what} ${file}: ${why}.`);
  }
  try {
    return JSON.parse(text);
  } catch (err) {
    throw new InputProblem(`The ${what} ${file} is not valid JSON: ${(err as Error).message.split('\n')[0]}.`);
  }
}

function main(argv: string[]): number {
  if (argv.includes('--schema')) {
    console.log(JSON.stringify(studyJsonSchema(), null, 2));
    return 0;
  }
  const flagValue = (flag: string) => {
    const i = argv.indexOf(flag);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  if (argv.includes('--limits') && !flagValue('--limits')) throw new InputProblem('--limits needs a limit-set file after it.');
  const limitsFile = flagValue('--limits') ?? DEFAULT_LIMITS;
  const file = argv.find((a, i) => !a.startsWith('--') && argv[i - 1] !== '--limits');
  if (!file) {
    console.error('Usage: npm run calc -- <study.json> [--json] [--limits limit-set.json] | --schema');
    return 2;
  }
  const parsed = studySchema.safeParse(readJson(file, 'study'));
  if (!parsed.success) {
    console.error(`${file} needs correcting:`);
    for (const issue of describeIssues(parsed.error)) console.error(`  ${issue.field}: ${issue.message}`);
    return 1;
  }
  const limits = limitSetSchema.safeParse(readJson(limitsFile, 'limit set'));
  if (!limits.success) {
    const first = limits.error.issues[0];
    throw new InputProblem(`The limit set ${limitsFile} is not a limit set: ${first.path.join('.') || '(top level)'}: ${first.message}${limits.error.issues.length > 1 ? ` (and ${limits.error.issues.length - 1} more)` : ''}.`);
  }
  try {
    const results = calculateStudy(parsed.data);
    const checklist = evaluateCompliance(parsed.data, results, limits.data);
    if (argv.includes('--json')) console.log(JSON.stringify({ results, checklist }, null, 2));
    else console.log(formatSummary(parsed.data.title, results, checklist, limits.data));
    return checklist.some((c) => c.status === 'fail') ? 3 : 0;
  } catch (err) {
    if (err instanceof CalculationError) {
      console.error(`Cannot calculate ${file}: ${err.message}${err.path.length ? ` (see ${err.path.join('.')})` : ''}`);
      return 1;
    }
    throw err;
  }
}

try {
  process.exitCode = main(process.argv.slice(2));
} catch (err) {
  if (!(err instanceof InputProblem)) throw err;
  console.error(err.message);
  process.exitCode = 1;
}
