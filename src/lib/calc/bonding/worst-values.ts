import type { CaseResult, SheathEndVoltage, WorstQuantity, WorstValue } from './results';

type Candidate = { value: number; where: string };

const isFault = (c: CaseResult) => c.kind !== 'normal' && c.kind !== 'emergency';

export const REFERENCE = {
  remote: 'to remote earth',
  local: 'to the local earth (link-box electrode or station grid)',
  across: 'across the joint (sheath end to sheath end)',
  svl: 'across the SVL terminals',
  none: '',
} as const;

/**
 * What a person at a link box or station, or an SVL to earth, sees: sheath to the local earth
 * node; where a point has none, to remote earth.
 */
export function standingVoltage(e: SheathEndVoltage): { value: number; reference: string } {
  return e.toLocalEarthV === null ? { value: e.voltageV, reference: REFERENCE.remote } : { value: e.toLocalEarthV, reference: 'to the local earth' };
}

/**
 * What stresses the oversheath at a point: the sheath against the soil round it. Near an
 * electrode the soil sits between its rise and remote earth, so the larger of the two
 * voltages is taken (common practice: the conservative bound).
 */
export function oversheathVoltage(e: SheathEndVoltage): { value: number; reference: string } {
  return e.toLocalEarthV !== null && e.toLocalEarthV > e.voltageV
    ? { value: e.toLocalEarthV, reference: 'to the local earth' }
    : { value: e.voltageV, reference: REFERENCE.remote };
}

/** Per quantity, the largest value over all cases, with where and in which case it occurs. */
export function worstValues(cases: CaseResult[]): WorstValue[] {
  const extractors: Array<{ quantity: WorstQuantity; unit: WorstValue['unit']; reference: string; applies: (c: CaseResult) => boolean; candidates: (c: CaseResult) => Candidate[] }> = [
    { quantity: 'standing-voltage-normal', unit: 'V', reference: REFERENCE.local, applies: (c) => c.kind === 'normal', candidates: standingVoltages },
    { quantity: 'standing-voltage-emergency', unit: 'V', reference: REFERENCE.local, applies: (c) => c.kind === 'emergency', candidates: standingVoltages },
    { quantity: 'route-voltage-normal', unit: 'V', reference: REFERENCE.remote, applies: (c) => c.kind === 'normal', candidates: profileVoltages },
    { quantity: 'sheath-voltage-fault', unit: 'V', reference: 'the larger of to remote earth and to the local earth', applies: isFault, candidates: oversheathVoltages },
    {
      quantity: 'joint-voltage-fault',
      unit: 'V',
      reference: REFERENCE.across,
      applies: isFault,
      candidates: (c) => c.points.flatMap((p) => p.acrossJoint.map((a) => ({ value: a.voltageV, where: `${p.label}, cable ${a.cable}` }))),
    },
    {
      quantity: 'svl-voltage',
      unit: 'V',
      reference: REFERENCE.svl,
      applies: () => true,
      candidates: (c) => c.svls.map((s) => ({ value: s.voltageV, where: `SVL at joint ${s.jointIndex}, cable ${s.cable} (${s.terminals})` })),
    },
    {
      quantity: 'sheath-current',
      unit: 'A',
      reference: REFERENCE.none,
      applies: () => true,
      candidates: (c) => c.sheathCurrents.map((s) => ({ value: s.maxA, where: `sheath ${s.cable}` })),
    },
    { quantity: 'ecc-current', unit: 'A', reference: REFERENCE.none, applies: () => true, candidates: (c) => c.eccCurrents.map((e) => ({ value: e.maxA, where: `ECC ${e.eccId}` })) },
    { quantity: 'loss-factor', unit: '', reference: REFERENCE.none, applies: () => true, candidates: (c) => c.lossFactors.map((l) => ({ value: l.lossFactor, where: `cable ${l.cable}` })) },
    {
      quantity: 'earth-potential-rise',
      unit: 'V',
      reference: 'local earth to remote earth',
      applies: () => true,
      candidates: (c) => c.points.flatMap((p) => (p.earthBarV === undefined ? [] : [{ value: p.earthBarV, where: p.label }])),
    },
  ];

  return extractors.flatMap(({ quantity, unit, reference, applies, candidates }) => {
    let best: WorstValue | undefined;
    for (const c of cases) {
      if (!applies(c)) continue;
      for (const cand of candidates(c)) {
        if (!best || cand.value > best.value) best = { quantity, unit, reference, value: cand.value, caseId: c.caseId, where: cand.where };
      }
    }
    return best ? [best] : [];
  });
}

export function standingVoltages(c: CaseResult): Candidate[] {
  return c.points.flatMap((p) =>
    p.sheathEnds.map((e) => {
      const s = standingVoltage(e);
      return { value: s.value, where: `${p.label}, sheath ${e.cable} ${s.reference}` };
    }),
  );
}

export function oversheathVoltages(c: CaseResult): Candidate[] {
  return c.points.flatMap((p) =>
    p.sheathEnds.map((e) => {
      const s = oversheathVoltage(e);
      return { value: s.value, where: `${p.label}, sheath ${e.cable} ${s.reference}` };
    }),
  );
}

/** The highest point of each series only: profiles are long, and only the maximum matters. */
function profileVoltages(c: CaseResult): Candidate[] {
  return c.profile.series.flatMap((s) => {
    let top = -1;
    s.voltageV.forEach((v, i) => {
      if (v !== null && (top < 0 || v > s.voltageV[top]!)) top = i;
    });
    return top < 0 ? [] : [{ value: s.voltageV[top]!, where: `${s.label} at ${c.profile.chainageM[top].toFixed(0)} m` }];
  });
}
