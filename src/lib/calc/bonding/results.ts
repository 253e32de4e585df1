/**
 * What a bonding study's calculation returns; plain JSON. Every voltage names its reference:
 * `voltageV` is to remote earth (the reference of the network, zero potential far away),
 * `toLocalEarthV` to the earth node at the same point (the station grid or the link-box
 * electrode), `acrossJoint` between the two sheath ends of a joint.
 */

export type PointKind = 'route-end' | 'earthed-link-box' | 'cross-bonding-link-box' | 'open-end' | 'mid-point-earthing';

export interface SheathEndVoltage {
  cable: string;
  side: 'arriving' | 'leaving';
  /** To remote earth. */
  voltageV: number;
  angleDeg: number;
  /** To the local earth node here (link-box terminal to its earth, or sheath to station earth); null where the point has none. */
  toLocalEarthV: number | null;
  toLocalEarthAngleDeg: number | null;
}

/** The earth node at a point, and its rise above remote earth. */
export interface LocalEarth {
  kind: 'station-grid' | 'link-box-electrode' | 'no-electrode';
  /** Electrode resistance to remote earth; null for a box with no electrode. */
  resistanceOhm: number | null;
  /** Rise of the local earth above remote earth (GPR), V. */
  voltageV: number;
  angleDeg: number;
  /** Current the electrode passes to remote earth, A. */
  electrodeCurrentA: number;
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
  /** Local earth to remote earth (same as localEarth.voltageV). */
  earthBarV?: number;
  localEarth: LocalEarth | null;
  eccV: Array<{ eccId: string; voltageV: number; toLocalEarthV: number | null }>;
  /** Largest sheath-end voltage to remote earth here. */
  maxV: number;
  /** Largest sheath-end voltage to the local earth here; null where the point has none. */
  maxToLocalEarthV: number | null;
}

export interface SvlResult {
  svlIndex: number;
  jointIndex: number;
  cable: string;
  connection: 'to-earth' | 'across-joint';
  /** What the SVL is connected between, in words. */
  terminals: string;
  /** Between its two terminals. */
  voltageV: number;
  angleDeg: number;
  conducting: boolean;
  /** Current through the SVL when it conducts (0 when it blocks), A. */
  currentA: number;
  currentAngleDeg: number;
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
  kind: 'normal' | 'emergency' | 'three-phase-fault' | 'earth-fault' | 'phase-phase-earth-fault' | 'internal-fault' | 'station-gpr';
  durationS?: number;
  points: PointResult[];
  svls: SvlResult[];
  sheathCurrents: Array<{ cable: string; maxA: number; perSegment: Array<{ sectionId: string; startM: number; lengthM: number; currentA: number }> }>;
  eccCurrents: Array<{ eccId: string; maxA: number }>;
  /** Circulating-current loss factor λ1' per cable (load cases with current only). */
  lossFactors: Array<{ cable: string; lossFactor: number }>;
  /** Largest current in the cross-bonding leads at each cross-bonding joint (the sheath current arriving there), A. */
  bondingLeadCurrents: Array<{ jointIndex: number; maxA: number }>;
  /** Figures a checker reproduces by hand: induced EMF and sheath current per kA of the case's largest core current. */
  handCheck: CaseHandCheck;
  /** Sheath and ECC voltage to remote earth along the route; chainages repeat at joints where a sheath is cut. */
  profile: { chainageM: number[]; series: ProfileSeries[] };
}

export interface CaseHandCheck {
  /** The largest core current of the case, A: the "per kA" below is per kA of it. */
  referenceCurrentA: number;
  /** Open-circuit EMF induced along each sheath, |Σ Z_sc·I_c|, V/km per kA, in each cross-section. */
  emfVPerKmPerKA: Array<{ crossSection: string; cable: string; value: number }>;
  /** Largest sheath current per kA of the reference current, A/kA. */
  sheathCurrentAPerKA: Array<{ cable: string; value: number }>;
}

/** The per-kilometre impedance matrix of one cross-section, with earth return (Carson), Ω/km as [re, im]. */
export interface CrossSectionMatrix {
  crossSection: string;
  layoutId: string;
  phaseRotation: number;
  sectionIds: string[];
  conductors: string[];
  impedanceOhmPerKm: Array<Array<[number, number]>>;
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
  /** Which reference the value is measured against, in words. */
  reference: string;
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
  /** Per distinct cross-section, the impedance matrix the solve used, for hand checks. */
  impedanceMatrices: CrossSectionMatrix[];
}
