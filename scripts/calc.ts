// npm run calc -- <study.json> [--json] [--limits limit-set.json]
// npm run calc -- --schema
import { readFileSync } from 'node:fs';
import { calculateStudy, evaluateCompliance, CalculationError } from '../src/lib/calc';
import { describeIssues, studyJsonSchema, studySchema } from '../src/lib/schemas/study.schema';
import { limitSetSchema } from '../src/lib/schemas/limit-set.schema';
import { formatSummary } from './calc-summary';

const DEFAULT_LIMITS = 'tests/fixtures/limit-sets/demo-owner.json';

function main(argv: string[]): number {
  if (argv.includes('--schema')) {
    console.log(JSON.stringify(studyJsonSchema(), null, 2));
    return 0;
  }
  const flagValue = (flag: string) => {
    const i = argv.indexOf(flag);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  const limitsFile = flagValue('--limits') ?? DEFAULT_LIMITS;
  const file = argv.find((a, i) => !a.startsWith('--') && argv[i - 1] !== '--limits');
  if (!file) {
    console.error('Usage: npm run calc -- <study.json> [--json] [--limits limit-set.json] | --schema');
    return 2;
  }
  const parsed = studySchema.safeParse(JSON.parse(readFileSync(file, 'utf8')));
  if (!parsed.success) {
    console.error(`${file} needs correcting:`);
    for (const issue of describeIssues(parsed.error)) console.error(`  ${issue.field}: ${issue.message}`);
    return 1;
  }
  const limits = limitSetSchema.parse(JSON.parse(readFileSync(limitsFile, 'utf8')));
  try {
    const results = calculateStudy(parsed.data);
    const checklist = evaluateCompliance(parsed.data, results, limits);
    if (argv.includes('--json')) console.log(JSON.stringify({ results, checklist }, null, 2));
    else console.log(formatSummary(parsed.data.title, results, checklist, limits));
    return checklist.some((c) => c.status === 'fail') ? 3 : 0;
  } catch (err) {
    if (err instanceof CalculationError) {
      console.error(`Cannot calculate ${file}: ${err.message}${err.path.length ? ` (see ${err.path.join('.')})` : ''}`);
      return 1;
    }
    throw err;
  }
}

process.exitCode = main(process.argv.slice(2));
