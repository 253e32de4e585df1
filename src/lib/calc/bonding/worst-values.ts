import type { CaseResult, WorstQuantity, WorstValue } from './results';

type Candidate = { value: number; where: string };

const isFault = (c: CaseResult) => c.kind === 'three-phase-fault' || c.kind === 'earth-fault';

/** Per quantity, the largest value over all cases, with where and in which case it occurs. */
export function worstValues(cases: CaseResult[]): WorstValue[] {
  const extractors: Array<{ quantity: WorstQuantity; unit: WorstValue['unit']; applies: (c: CaseResult) => boolean; candidates: (c: CaseResult) => Candidate[] }> = [
    { quantity: 'standing-voltage-normal', unit: 'V', applies: (c) => c.kind === 'normal', candidates: pointVoltages },
    { quantity: 'standing-voltage-emergency', unit: 'V', applies: (c) => c.kind === 'emergency', candidates: pointVoltages },
    { quantity: 'route-voltage-normal', unit: 'V', applies: (c) => c.kind === 'normal', candidates: profileVoltages },
    { quantity: 'sheath-voltage-fault', unit: 'V', applies: isFault, candidates: pointVoltages },
    {
      quantity: 'joint-voltage-fault',
      unit: 'V',
      applies: isFault,
      candidates: (c) => c.points.flatMap((p) => p.acrossJoint.map((a) => ({ value: a.voltageV, where: `${p.label}, cable ${a.cable}` }))),
    },
    {
      quantity: 'svl-voltage',
      unit: 'V',
      applies: () => true,
      candidates: (c) => c.svls.map((s) => ({ value: s.voltageV, where: `SVL at joint ${s.jointIndex}, cable ${s.cable}` })),
    },
    {
      quantity: 'sheath-current',
      unit: 'A',
      applies: () => true,
      candidates: (c) => c.sheathCurrents.map((s) => ({ value: s.maxA, where: `sheath ${s.cable}` })),
    },
    { quantity: 'ecc-current', unit: 'A', applies: () => true, candidates: (c) => c.eccCurrents.map((e) => ({ value: e.maxA, where: `ECC ${e.eccId}` })) },
    { quantity: 'loss-factor', unit: '', applies: () => true, candidates: (c) => c.lossFactors.map((l) => ({ value: l.lossFactor, where: `cable ${l.cable}` })) },
    {
      quantity: 'earth-potential-rise',
      unit: 'V',
      applies: () => true,
      candidates: (c) => c.points.flatMap((p) => (p.earthBarV === undefined ? [] : [{ value: p.earthBarV, where: p.label }])),
    },
  ];

  return extractors.flatMap(({ quantity, unit, applies, candidates }) => {
    let best: WorstValue | undefined;
    for (const c of cases) {
      if (!applies(c)) continue;
      for (const cand of candidates(c)) {
        if (!best || cand.value > best.value) best = { quantity, unit, value: cand.value, caseId: c.caseId, where: cand.where };
      }
    }
    return best ? [best] : [];
  });
}

function pointVoltages(c: CaseResult): Candidate[] {
  return c.points.flatMap((p) => p.sheathEnds.map((e) => ({ value: e.voltageV, where: `${p.label}, sheath ${e.cable}` })));
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
