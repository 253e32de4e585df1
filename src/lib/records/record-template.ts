import { readFileSync } from 'node:fs';
import path from 'node:path';

// The record's fixed wording and layout live in templates/record so they can be reviewed and
// changed without touching code.

export interface RecordText {
  documentTitle: string;
  draftMarking: string;
  issuedMarking: string;
  scopeHeading: string;
  scope: string;
  methodHeading: string;
  method: string[];
  methodStatement: string;
  validationLinked: string;
  validationAppended: string;
  noValidation: string;
  inputsHeading: string;
  resultsHeading: string;
  plotHeading: string;
  plotCaption: string;
  plotNote: string;
  plotNoLimit: string;
  /** Said instead of the plots when the stored results carry no profile and it cannot be recomputed from the same inputs. */
  plotUnavailable: string;
  historyHeading: string;
  stepsHeading: string;
  changesHeading: string;
  noChanges: string;
  assumptionsHeading: string;
  limitsHeading: string;
  limitsIntro: string;
  noLimitSet: string;
  otherLimits: string;
  manualHeading: string;
  filesHeading: string;
  noFiles: string;
  commissioningHeading: string;
  commissioningIntro: string;
  commissioningUnavailable: string;
  checklistHeading: string;
  remarksHeading: string;
  noRemarks: string;
  checkValuesHeading: string;
  noCheckValues: string;
  signOffHeading: string;
  notSigned: string;
  cautionHeading: string;
  caution: string;
  footer: string;
}

export interface RecordLayout {
  font: string;
  bodySize: number;
  smallSize: number;
  titleSize: number;
  headingColour: string;
  draftColour: string;
  tableHeaderShading: string;
  pageMargin: number;
  plot: { widthPx: number; heightPx: number; widthEmuPt: number; heightEmuPt: number };
}

let cached: { text: RecordText; layout: RecordLayout } | undefined;

export function recordTemplate(dir = path.resolve(process.cwd(), 'templates/record')) {
  cached ??= {
    text: JSON.parse(readFileSync(path.join(dir, 'text.json'), 'utf8')),
    layout: JSON.parse(readFileSync(path.join(dir, 'layout.json'), 'utf8')),
  };
  return cached;
}

/** Fills {placeholders} in a template string. */
export const fill = (template: string, values: Record<string, string | number>): string =>
  template.replace(/\{(\w+)\}/g, (_, k: string) => String(values[k] ?? `{${k}}`));
