import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import type { Paragraph, Table } from 'docx';
import type { ValidationReport } from '../methods/validation-report';
import { reportNumber, toleranceText, validationSummary } from '../methods/validation-report';
import { METHODS_PATH, methodEngineLabel } from '../methods/method-reference';
import { fill, recordTemplate } from './record-template';
import { body, subheading } from './record-paragraphs';
import { textTable } from './record-tables';

/** What a record says about its engine's method and validation. */
export interface RecordValidation {
  engineVersion: string | null;
  /** The committed report for that engine version, if one is held. */
  report: ValidationReport | null;
  /** The administrator's choice: append the full table rather than link to it. */
  append: boolean;
  /** Where readers find the method page (the app's address), if known. */
  appUrl: string | null;
}

const VERSION = /^[0-9A-Za-z.+-]{1,40}$/;

/**
 * The committed validation report of an engine version (docs/validation/engine-<version>.json),
 * read from the working directory like the record's templates. Records are also rendered by
 * scripts run outside the bundler, so this reads the file rather than embedding it.
 */
export function committedValidationFile(engineVersion: string | null, root = process.cwd()): ValidationReport | null {
  if (!engineVersion || !VERSION.test(engineVersion)) return null;
  const file = path.join(root, 'docs/validation', `engine-${engineVersion}.json`);
  return existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as ValidationReport) : null;
}

const link = (v: RecordValidation, anchor: string) => `${v.appUrl ?? ''}${METHODS_PATH}${anchor}`;

/** The method statement and the engine's validation, as paragraphs under the record's Method heading. */
export function validationBlocks(v: RecordValidation): Array<Paragraph | Table> {
  const { text } = recordTemplate();
  const engine = v.engineVersion ?? 'not calculated';
  const blocks: Array<Paragraph | Table> = [body(fill(text.methodStatement, { engine: v.engineVersion ? methodEngineLabel(v.engineVersion) : engine, url: link(v, '') }))];
  if (!v.report) return [...blocks, body(fill(text.noValidation, { engine }), { italic: true })];
  const summary = validationSummary(v.report);
  if (!v.append) return [...blocks, body(fill(text.validationLinked, { summary, date: v.report.generatedAt, url: link(v, '#validation') }))];
  return [
    ...blocks,
    body(fill(text.validationAppended, { summary, date: v.report.generatedAt })),
    subheading(summary),
    textTable(
      ['id', 'section', 'quantity', 'expected', 'engine', 'difference', 'tolerance', 'within'],
      v.report.groups.flatMap((g) => g.checks.map((c) => [c.id, g.section || '—', c.quantity, `${reportNumber(c.expected)} ${c.unit}`.trim(), `${reportNumber(c.engine)} ${c.unit}`.trim(), reportNumber(c.difference), toleranceText(c.tolerance), c.within ? 'yes' : 'NO'])),
    ),
  ];
}
