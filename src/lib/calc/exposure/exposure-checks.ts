import type { ExposureStudy } from '../../schemas/exposure-study.schema';
import type { InputIssue } from '../bonding/study-checks';

/** Cross-field checks of an exposure study; each issue names the field and what to fix. */
export function checkExposureStudy(study: ExposureStudy): InputIssue[] {
  const issues: InputIssue[] = [];
  const ids = new Set<string>();
  study.sources.forEach((s, i) => {
    if (ids.has(s.id)) issues.push({ path: ['sources', i, 'id'], message: `The identifier "${s.id}" is used twice.` });
    ids.add(s.id);
    if (Math.hypot(s.xM - study.object.xM, s.yM - study.object.yM) < study.object.gmrMm / 1000) {
      issues.push({ path: ['sources', i], message: 'This source coincides with the metalwork: give their real separation.' });
    }
  });
  study.cases.forEach((c, i) => {
    c.currents.forEach((cur, k) => {
      if (!ids.has(cur.sourceId)) issues.push({ path: ['cases', i, 'currents', k, 'sourceId'], message: `No source "${cur.sourceId}".` });
    });
    if (c.kind === 'fault' && c.durationS === undefined) issues.push({ path: ['cases', i, 'durationS'], message: 'A fault case needs its duration for the tolerable touch voltage.' });
  });
  if (study.object.type === 'pipeline' && study.object.coatingDefectDiameterMm === undefined) {
    issues.push({ path: ['object', 'coatingDefectDiameterMm'], message: 'Give a coating defect diameter for the a.c. current density (1 cm² is d = 11.28 mm).' });
  }
  return issues;
}
