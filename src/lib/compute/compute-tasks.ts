import { CalculationError, ENGINE_VERSION, type ChecklistItem, type Study, type StudyResults, calculateStudy, evaluateCompliance } from '../calc';
import type { CaseResult } from '../calc/bonding/results';
import type { LimitSet } from '../schemas/limit-set.schema';
import { AppError, type ErrorName, type FieldError } from '../errors';
import { canonicalJson, sha256Hex } from '../canonical-json';
import { parseStudyInputs } from '../studies/study-input';
import { compactResults } from '../studies/stored-results';
import { renderRecord } from '../records/record-document';
import type { RecordData } from '../records/record-data';
import type { AuditScope } from '../audit/audit-scope';
import { type RangeReport, verifyAuditRange } from '../audit/audit-verify-range';
import { ExploreError } from '../calc/explore/errors';
import type { SweepPoint } from '../calc/explore';
import { type ExplorationResult, type ExplorationTask, explorationOnce, sweepPoints } from '../explore/exploration-steps';

// The CPU-heavy work of the server, as plain functions of cloneable data: a worker thread runs
// them (compute.worker.ts), or the request thread when no worker is at hand (compute-pool.ts).

type StudyKind = 'bonding' | 'exposure';

export type ComputeTask =
  /**
   * Validate the inputs, calculate every case and evaluate it against the limit set. With
   * `reuse`, results already stored for these inputs are kept instead when they hash (in compact
   * form) to what a fresh calculation of these inputs with this engine gave.
   */
  | { task: 'calculate'; studyKind: StudyKind; rawInputs: unknown; limits: LimitSet; reuse?: { storedBytes: Uint8Array; knownHash: string } }
  /** SHA-256 of the canonical JSON of results given as JSON bytes (what a sign-off records). */
  | { task: 'resultsHash'; bytes: Uint8Array }
  /** Calculate again and give the hashes of the results as stored (compact) and in full. */
  | { task: 'reproduce'; studyKind: StudyKind; rawInputs: unknown }
  /** The route profile of one bonding case, recomputed from the inputs. */
  | { task: 'profile'; studyKind: StudyKind; rawInputs: unknown; caseId: string }
  /** The calculation record as .docx bytes. */
  | { task: 'record'; data: RecordData }
  /** One stretch of the audit chain (afterId < id ≤ upToId), read on its own connection. */
  | { task: 'verifyAudit'; databaseUrl: string; scope: AuditScope; afterId: number; upToId: number }
  /** Grid points from..to−1 of a design-exploration sweep. */
  | { task: 'sweepPoints'; sweep: Extract<ExplorationTask, { kind: 'sweep' }>; from: number; to: number }
  /** A bonding-options appraisal, tornado or joint-bay placement. */
  | { task: 'exploreOnce'; exploration: Exclude<ExplorationTask, { kind: 'sweep' }> };

/** A catalogue error carried across the thread boundary (a class does not survive cloning). */
export interface TaskError {
  errorName: ErrorName;
  message: string;
  fields: FieldError[];
}

export interface Calculated {
  inputs: Study;
  /**
   * What is stored, as UTF-8 JSON bytes, compact (stored-results.ts); null when the stored results
   * are kept. Bytes cross the thread boundary as one copy and go to the database as they are,
   * where an object graph of megabytes would be rebuilt (and serialised again) on the request thread.
   */
  resultsBytes: Uint8Array | null;
  computed: ChecklistItem[];
  /** SHA-256 of the canonical JSON of `results` in compact form. */
  resultsHash: string;
  /** false: the stored results were kept (they are what the engine gives for these inputs). */
  fresh: boolean;
}

export interface Reproduced {
  compactHash: string;
  fullHash: string;
}

export type TaskResult<T> = { ok: true; value: T } | { ok: false; error: TaskError };

export type ComputeOutput = {
  calculate: Calculated;
  resultsHash: string;
  reproduce: Reproduced;
  profile: CaseResult['profile'] | null;
  record: Uint8Array;
  verifyAudit: RangeReport;
  sweepPoints: SweepPoint[];
  exploreOnce: ExplorationResult;
};

const hashOf = (value: unknown) => sha256Hex(canonicalJson(value));
const storedMatches = (stored: StudyResults, knownHash: string) => hashOf(compactResults(stored)) === knownHash;
const parseBytes = (bytes: Uint8Array) => JSON.parse(new TextDecoder().decode(bytes)) as StudyResults;

/** Runs one task; catalogue and calculation errors come back as values, anything else throws. */
export async function runComputeTask(t: ComputeTask): Promise<TaskResult<unknown>> {
  try {
    return { ok: true, value: await run(t) };
  } catch (err) {
    if (err instanceof AppError) return { ok: false, error: { errorName: err.errorName, message: err.message, fields: err.fields } };
    if (err instanceof ExploreError) return { ok: false, error: { errorName: 'InvalidInput', message: err.message, fields: [{ field: err.field, message: err.message }] } };
    if (err instanceof CalculationError) {
      return { ok: false, error: { errorName: 'InvalidInput', message: err.message, fields: [{ field: `inputs.${err.path.join('.') || '(study)'}`, message: err.message }] } };
    }
    throw err;
  }
}

async function run(t: ComputeTask): Promise<unknown> {
  switch (t.task) {
    case 'calculate': {
      const inputs = parseStudyInputs(t.rawInputs, t.studyKind);
      // The checks read worst values and points, never the route profile compact results lack.
      if (t.reuse) {
        const stored = parseBytes(t.reuse.storedBytes);
        if (storedMatches(stored, t.reuse.knownHash)) {
          return { inputs, resultsBytes: null, computed: evaluateCompliance(inputs, stored, t.limits), resultsHash: t.reuse.knownHash, fresh: false } satisfies Calculated;
        }
      }
      const full = calculateStudy(inputs);
      const computed = evaluateCompliance(inputs, full, t.limits);
      const results = compactResults(full);
      return { inputs, resultsBytes: new TextEncoder().encode(JSON.stringify(results)), computed, resultsHash: hashOf(results), fresh: true } satisfies Calculated;
    }
    case 'resultsHash':
      return hashOf(parseBytes(t.bytes));
    case 'reproduce': {
      const full = calculateStudy(parseStudyInputs(t.rawInputs, t.studyKind));
      return { compactHash: hashOf(compactResults(full)), fullHash: hashOf(full) } satisfies Reproduced;
    }
    case 'profile': {
      const full = calculateStudy(parseStudyInputs(t.rawInputs, t.studyKind));
      return full.kind === 'bonding' ? (full.cases.find((c) => c.caseId === t.caseId)?.profile ?? null) : null;
    }
    case 'record':
      return new Uint8Array(await renderRecord(withProfiles(t.data)));
    case 'verifyAudit':
      return verifyAuditRange(t.databaseUrl, t.scope, t.afterId, t.upToId);
    case 'sweepPoints':
      return sweepPoints(t.sweep, t.from, t.to);
    case 'exploreOnce':
      return explorationOnce(t.exploration);
  }
}

/** Record data whose bonding cases all carry their route profile, recomputed when stored without. */
function withProfiles(data: RecordData): RecordData {
  const results = data.results;
  if (!results || results.kind !== 'bonding' || data.inputs.kind !== 'bonding' || results.cases.every((c) => c.profile)) return data;
  // Only the same inputs with the same engine give the profile that belongs with these figures.
  if (data.revision.resultsInputsHash !== data.revision.inputsHash || data.revision.engineVersion !== ENGINE_VERSION) return data;
  const fresh = calculateStudy(data.inputs);
  if (fresh.kind !== 'bonding') return data;
  const profiles = new Map(fresh.cases.map((c) => [c.caseId, c.profile]));
  return { ...data, results: { ...results, cases: results.cases.map((c) => ({ ...c, profile: c.profile ?? profiles.get(c.caseId)! })) } };
}
