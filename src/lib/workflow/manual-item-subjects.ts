import type { Study } from '../calc';

// Manual checklist questions ask about a thing in the design (an ECC, an SVL, a cross-bonded
// run). When the study's inputs show that thing is absent, the study itself answers "not
// applicable" and says why; when it is present, nobody may answer "not applicable". The
// questions are matched by their key in the limit set. A key not listed here has no known
// subject: people answer it, "not applicable" included (with a reason).

export interface Subject {
  /** The thing the question is about, in words ("a single-point bonded section"). */
  what: string;
  exists: boolean;
}

type Rule = (study: Study) => Subject;

const bonding = (study: Study) => (study.kind === 'bonding' ? study : null);
const NOT_BONDING = 'this is an exposure study of metalwork, with no cable sheath bonding of its own';

const rules: Record<string, Rule> = {
  'ecc-transposed': (s) => ({ what: 'a single-point bonded section', exists: !!bonding(s)?.bonding.some((g) => g.kind === 'single-point') }),
  'svl-datasheet': (s) => ({ what: 'a sheath voltage limiter (SVL)', exists: (bonding(s)?.svls.length ?? 0) > 0 }),
  'continuity-test': (s) => ({ what: 'a cross-bonded run', exists: !!bonding(s)?.bonding.some((g) => g.kind === 'cross-bonded' && g.sectionIds.length > 0) }),
  // Every bonding arrangement has link boxes or bonding leads and an oversheath to test; only a
  // study without cable bonding lacks them.
  'link-boxes': (s) => ({ what: 'cable sheath bonding', exists: !!bonding(s) }),
  'bonding-leads': (s) => ({ what: 'cable sheath bonding', exists: !!bonding(s) }),
  'oversheath-test': (s) => ({ what: 'cable sheath bonding', exists: !!bonding(s) }),
};

/** What a manual question (by its key, without the "manual:" prefix) is about, or null when no rule knows. */
export function manualItemSubject(key: string, study: Study): Subject | null {
  const rule = rules[key.replace(/^manual:/, '')];
  return rule ? rule(study) : null;
}

/** The generated reason for a question whose subject is absent. */
export function generatedNotApplicableReason(subject: Subject, study: Study): string {
  const because = study.kind === 'bonding' ? `the study has no ${subject.what.replace(/^an? /, '')}` : NOT_BONDING;
  return `Not applicable, set by the study: ${because}.`;
}
