import type { ExposureStudy } from '../../schemas/exposure-study.schema';
import type { InputIssue } from '../bonding/study-checks';
import { earthReturnDepthM } from '../earth-return';

/**
 * Metalwork often runs tens of metres from a line, so the exposure bound is looser than the
 * cables' (see MIN_DEPTH_TO_SPACING): at D/De = 0.2 the dropped Carson term moves the mutual
 * reactance by about 11 %; beyond that the simplified formulae are not the method to use.
 */
export const EXPOSURE_MIN_DEPTH_TO_SPACING = 5;

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
  const points = [...study.sources, study.object];
  let widestM = 0;
  for (let a = 0; a < points.length; a++) {
    for (let b = a + 1; b < points.length; b++) widestM = Math.max(widestM, Math.hypot(points[a].xM - points[b].xM, points[a].yM - points[b].yM));
  }
  const depthM = earthReturnDepthM(study.soilResistivityOhmM, study.frequencyHz);
  if (depthM < EXPOSURE_MIN_DEPTH_TO_SPACING * widestM) {
    issues.push({
      path: ['soilResistivityOhmM'],
      message: `At ${study.soilResistivityOhmM} Ω·m the equivalent earth-return depth is ${depthM.toFixed(1)} m, not much larger than the ${widestM.toFixed(1)} m between conductors (Carson's simplified formulae need at least ${EXPOSURE_MIN_DEPTH_TO_SPACING}×). Check the resistivity and the positions.`,
    });
  }
  if (study.object.type === 'pipeline' && study.object.coatingDefectDiameterMm === undefined) {
    issues.push({ path: ['object', 'coatingDefectDiameterMm'], message: 'Give a coating defect diameter for the a.c. current density (1 cm² is d = 11.28 mm).' });
  }
  return issues;
}
