/** What a bonding study's calculation returns; plain JSON. Voltages are r.m.s. to earth unless named otherwise. */

export type PointKind = 'route-end' | 'earthed-link-box' | 'cross-bonding-link-box' | 'open-end' | 'mid-point-earthing';

export interface SheathEndVoltage {
  cable: string;
  side: 'arriving' | 'leaving';
  voltageV: number;
  angleDeg: number;
}

export interface PointResult {
  /** Joint number as the user counts them; null for an internal mid-point earthing. */
  jointIndex: number | null;
  chainageM: number;
  kind: PointKind;
  label: string;
  sheathEnds: SheathEndVoltage[];
  /** Voltage across the sectionalising insulation of each cable's joint, where the sheath is cut. */
  acrossJoint: Array<{ cable: string; voltageV: number }>;
  earthBarV?: number;
  eccV: Array<{ eccId: string; voltageV: number }>;
  /** Largest sheath-end voltage to earth here. */
  maxV: number;
}

export interface SvlResult {
  svlIndex: number;
  jointIndex: number;
  cable: string;
  connection: 'to-earth' | 'across-joint';
  voltageV: number;
  continuousRatingV: number;
  tovRatingV: number;
}

export interface ProfileSeries {
  label: string;
  kind: 'sheath' | 'ecc';
  /** null where the conductor does not run (an ECC outside its run). */
  voltageV: Array<number | null>;
}

export interface CaseResult {
  caseId: string;
  name: string;
  kind: 'normal' | 'emergency' | 'three-phase-fault' | 'earth-fault';
  durationS?: number;
  points: PointResult[];
  svls: SvlResult[];
  sheathCurrents: Array<{ cable: string; maxA: number; perSegment: Array<{ sectionId: string; startM: number; lengthM: number; currentA: number }> }>;
  eccCurrents: Array<{ eccId: string; maxA: number }>;
  /** Circulating-current loss factor λ1' per cable (load cases with current only). */
  lossFactors: Array<{ cable: string; lossFactor: number }>;
  /** Sheath and ECC voltage to earth along the route; chainages repeat at joints where a sheath is cut. */
  profile: { chainageM: number[]; series: ProfileSeries[] };
}

export type WorstQuantity =
  | 'standing-voltage-normal'
  | 'standing-voltage-emergency'
  | 'route-voltage-normal'
  | 'sheath-voltage-fault'
  | 'joint-voltage-fault'
  | 'svl-voltage'
  | 'sheath-current'
  | 'ecc-current'
  | 'loss-factor'
  | 'earth-potential-rise';

export interface WorstValue {
  quantity: WorstQuantity;
  value: number;
  unit: 'V' | 'A' | '';
  caseId: string;
  where: string;
}

export interface CrossCheck {
  description: string;
  caseId: string;
  closedForm: number;
  network: number;
  unit: string;
  /** (network − closed form)/closed form, in per cent. */
  differencePct: number;
  method: string;
}

export interface BondingResults {
  kind: 'bonding';
  engineVersion: string;
  routeLengthM: number;
  cases: CaseResult[];
  worst: WorstValue[];
  crossChecks: CrossCheck[];
}
