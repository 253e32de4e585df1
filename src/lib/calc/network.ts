import { type Complex, ZERO } from './complex';
import { BandedMatrix, IllConditionedError, factorBanded, solveFactored } from './banded-lu';
import { invertComplex, multiplyComplex } from './dense-complex';

// One coupled-branch network: nodes on metallic paths (sheaths, ECCs, metalwork), earth as
// the reference, and three kinds of element. Every bonding arrangement and exposure is a
// topology built from these; cases differ only in their source phasors.

/**
 * The reference node: remote earth at zero potential (Carson's earth-return formulation). It is
 * not the local earth at a link box or station: each of those is a node of its own, joined to
 * this reference through its electrode resistance.
 */
export const EARTH = -1;

/**
 * Per-metre data of a run of mutually coupled metallic conductors, shared by every segment of
 * the same cross-section: the inverse of their impedance matrix and its product with their
 * coupling to the source conductors (known currents).
 */
export interface CrossSectionCoupling {
  /** inv(Z_mm), S·m. */
  zInv: Complex[][];
  /** inv(Z_mm)·Z_ms: current per ampere of source current that the EMF drives into a short-circuited conductor. */
  sourceGain: Complex[][];
  /** Indices into the case's source vector, one per column of sourceGain. */
  sourceIndices: number[];
}

export function crossSectionCoupling(zmmOhmPerM: Complex[][], zmsOhmPerM: Complex[][], sourceIndices: number[]): CrossSectionCoupling {
  const zInv = invertComplex(zmmOhmPerM);
  return { zInv, sourceGain: zmsOhmPerM.length ? multiplyComplex(zInv, zmsOhmPerM) : [], sourceIndices };
}

interface Segment {
  from: number[];
  to: number[];
  lengthM: number;
  coupling: CrossSectionCoupling;
}

interface Admittance {
  a: number;
  b: number;
  admittanceS: Complex;
  /** Present only in cases that switch it on (e.g. a conducting SVL). */
  tag?: string;
}

interface Injection {
  node: number;
  sourceIndex: number;
  sign: 1 | -1;
}

export class FloatingNodesError extends Error {
  constructor(readonly labels: string[]) {
    super(`these points have no path to earth, so their voltage is undefined: ${labels.slice(0, 6).join('; ')}${labels.length > 6 ? ` and ${labels.length - 6} more` : ''}`);
  }
}

export class NetworkBuilder {
  private readonly labels: string[] = [];
  private readonly orderKeys: number[] = [];
  private readonly parent: number[] = [];
  readonly segments: Segment[] = [];
  private readonly admittances: Admittance[] = [];
  private readonly injections: Injection[] = [];
  /** Solid bonds as given, before merging: kept so an independent solver can rebuild the network. */
  private readonly bonds: Array<[number, number]> = [];

  /** A new node; `orderKey` (position along the route) keeps the equations banded. */
  addNode(orderKey: number, label: string): number {
    const id = this.labels.length;
    this.labels.push(label);
    this.orderKeys.push(orderKey);
    this.parent.push(id);
    return id;
  }

  /** Joins two nodes with no impedance between them (a solid bond). */
  connect(a: number, b: number): void {
    this.bonds.push([a, b]);
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra !== rb) this.parent[Math.max(ra, rb)] = Math.min(ra, rb);
  }

  addAdmittance(a: number, b: number, admittanceS: Complex, tag?: string): void {
    this.admittances.push({ a, b, admittanceS, tag });
  }

  /** A coupled run of conductors from nodes `from[i]` to `to[i]`; returns its index. */
  addSegment(from: number[], to: number[], lengthM: number, coupling: CrossSectionCoupling): number {
    this.segments.push({ from, to, lengthM, coupling });
    return this.segments.length - 1;
  }

  /** A current source into `node` equal to sign × the case's source phasor `sourceIndex`. */
  addInjection(node: number, sourceIndex: number, sign: 1 | -1): void {
    this.injections.push({ node, sourceIndex, sign });
  }

  find(n: number): number {
    while (this.parent[n] !== n) {
      this.parent[n] = this.parent[this.parent[n]];
      n = this.parent[n];
    }
    return n;
  }

  label(node: number): string {
    return this.labels[node];
  }

  get nodeCount(): number {
    return this.labels.length;
  }

  /** Every element as added (nodes unmerged), for rebuilding the network with another solver. */
  elements(activeTags: ReadonlySet<string> = new Set()) {
    return {
      nodeCount: this.labels.length,
      bonds: this.bonds.map(([a, b]) => [a, b] as [number, number]),
      admittances: this.admittances.filter((a) => !a.tag || activeTags.has(a.tag)).map(({ a, b, admittanceS }) => ({ a, b, admittanceS })),
      segments: this.segments,
      injections: this.injections.map((i) => ({ ...i })),
    };
  }

  /** Numbers the unknowns along the route, checks every node reaches earth, assembles and factorises. */
  compile(activeTags: ReadonlySet<string> = new Set()): CompiledNetwork {
    const reps = [...new Set(this.labels.map((_, i) => this.find(i)))];
    reps.sort((x, y) => this.orderKeys[x] - this.orderKeys[y] || x - y);
    const index = new Map<number, number>(reps.map((r, i) => [r, i]));
    // Node → unknown as a table: every voltage read by the results goes through it.
    const unknownOfNode = Int32Array.from(this.labels, (_, node) => index.get(this.find(node))!);
    const unknown = (node: number) => (node === EARTH ? EARTH : unknownOfNode[node]);
    const admittances = this.admittances.filter((a) => !a.tag || activeTags.has(a.tag));

    this.assertEarthed(reps.length, unknown, admittances);

    let bandwidth = 0;
    const widen = (nodes: number[]) => {
      const ids = nodes.filter((n) => n !== EARTH);
      bandwidth = Math.max(bandwidth, Math.max(...ids) - Math.min(...ids));
    };
    const segmentUnknowns = this.segments.map((s) => ({ from: s.from.map(unknown), to: s.to.map(unknown) }));
    segmentUnknowns.forEach((s) => widen([...s.from, ...s.to]));
    admittances.forEach((a) => widen([unknown(a.a), unknown(a.b)]));

    const matrix = new BandedMatrix(reps.length, bandwidth);
    this.segments.forEach((seg, k) => stampSegment(matrix, segmentUnknowns[k].from, segmentUnknowns[k].to, seg));
    for (const a of admittances) stampAdmittance(matrix, unknown(a.a), unknown(a.b), a.admittanceS);

    const assembled = matrix.clone();
    factorBanded(matrix);
    return new CompiledNetwork(
      matrix,
      assembled,
      this.segments,
      segmentUnknowns,
      this.injections.map((inj) => ({ ...inj, node: unknown(inj.node) })),
      unknown,
    );
  }

  private assertEarthed(n: number, unknown: (node: number) => number, admittances: Admittance[]) {
    const parent = Array.from({ length: n + 1 }, (_, i) => i);
    // Iterative with path halving: a recursive find overflows the stack on long routes.
    const find = (x: number): number => {
      while (parent[x] !== x) {
        parent[x] = parent[parent[x]];
        x = parent[x];
      }
      return x;
    };
    const join = (a: number, b: number) => {
      parent[find(a === EARTH ? n : a)] = find(b === EARTH ? n : b);
    };
    this.segments.forEach((s) => s.from.forEach((f, i) => join(unknown(f), unknown(s.to[i]))));
    admittances.forEach((a) => join(unknown(a.a), unknown(a.b)));
    const floating = this.labels.filter((_, node) => find(unknown(node)) !== find(n));
    if (floating.length) throw new FloatingNodesError([...new Set(floating)]);
  }
}

function stampSegment(m: BandedMatrix, from: number[], to: number[], seg: Segment) {
  const { zInv } = seg.coupling;
  for (let i = 0; i < from.length; i++) {
    for (let j = 0; j < from.length; j++) {
      const yr = zInv[i][j].re / seg.lengthM;
      const yi = zInv[i][j].im / seg.lengthM;
      m.add(from[i], from[j], yr, yi);
      m.add(from[i], to[j], -yr, -yi);
      m.add(to[i], from[j], -yr, -yi);
      m.add(to[i], to[j], yr, yi);
    }
  }
}

function stampAdmittance(m: BandedMatrix, a: number, b: number, y: Complex) {
  if (a !== EARTH) m.add(a, a, y.re, y.im);
  if (b !== EARTH) m.add(b, b, y.re, y.im);
  if (a !== EARTH && b !== EARTH) {
    m.add(a, b, -y.re, -y.im);
    m.add(b, a, -y.re, -y.im);
  }
}

/** A factorised network: solves any number of cases (source vectors) cheaply. */
export class CompiledNetwork {
  constructor(
    private readonly lu: BandedMatrix,
    /** The assembled admittance matrix before factorisation, for independent checks. */
    readonly assembled: BandedMatrix,
    private readonly segments: Segment[],
    private readonly segmentUnknowns: Array<{ from: number[]; to: number[] }>,
    private readonly injections: Injection[],
    private readonly unknown: (node: number) => number,
  ) {}

  get size(): number {
    return this.lu.size;
  }

  get bandwidth(): number {
    return this.lu.bandwidth;
  }

  /** The unknown (row of the system) that holds a node's voltage, or EARTH. */
  unknownOf(node: number): number {
    return this.unknown(node);
  }

  /**
   * The nodal current vector J for a case (Y·V = J). `segmentSources(k)`, when given, is the
   * source vector segment k sees (a core current that changes along the route, as on either
   * side of an internal fault); injections always use `sources`.
   */
  rightHandSide(sources: Complex[], segmentSources?: SegmentSources): { re: Float64Array; im: Float64Array } {
    const re = new Float64Array(this.size);
    const im = new Float64Array(this.size);
    this.segments.forEach((seg, k) => {
      const drive = segmentDrive(seg, segmentSources ? segmentSources(k) : sources);
      const { from, to } = this.segmentUnknowns[k];
      drive.forEach((d, i) => {
        if (from[i] !== EARTH) {
          re[from[i]] += d.re;
          im[from[i]] += d.im;
        }
        if (to[i] !== EARTH) {
          re[to[i]] -= d.re;
          im[to[i]] -= d.im;
        }
      });
    });
    for (const inj of this.injections) {
      if (inj.node === EARTH) continue;
      re[inj.node] += inj.sign * sources[inj.sourceIndex].re;
      im[inj.node] += inj.sign * sources[inj.sourceIndex].im;
    }
    return { re, im };
  }

  solve(sources: Complex[], segmentSources?: SegmentSources): NetworkSolution {
    const { re, im } = this.rightHandSide(sources, segmentSources);
    solveFactored(this.lu, re, im);
    for (let i = 0; i < re.length; i++) {
      if (!Number.isFinite(re[i]) || !Number.isFinite(im[i])) throw new IllConditionedError(i);
    }
    return new NetworkSolution(re, im, this.segments, this.segmentUnknowns, this.unknown, segmentSources ?? (() => sources));
  }
}

/** The source vector each segment sees, by segment index. */
export type SegmentSources = (segmentIndex: number) => Complex[];

/** inv(Z)·Z_ms·I_s: the short-circuit current each conductor's induced EMF drives (plain arithmetic: this runs per segment and case). */
function segmentDrive(seg: Segment, sources: Complex[]): Complex[] {
  const { sourceGain, sourceIndices } = seg.coupling;
  return sourceGain.map((row) => {
    let re = 0;
    let im = 0;
    for (let c = 0; c < row.length; c++) {
      const g = row[c];
      const s = sources[sourceIndices[c]];
      re += g.re * s.re - g.im * s.im;
      im += g.re * s.im + g.im * s.re;
    }
    return { re, im };
  });
}

export class NetworkSolution {
  constructor(
    private readonly re: Float64Array,
    private readonly im: Float64Array,
    private readonly segments: Segment[],
    private readonly segmentUnknowns: Array<{ from: number[]; to: number[] }>,
    private readonly unknown: (node: number) => number,
    private readonly sources: SegmentSources,
  ) {}

  /** Voltage of a node to the reference (remote earth), V. */
  voltage(node: number): Complex {
    const u = this.unknown(node);
    return u === EARTH ? ZERO : { re: this.re[u], im: this.im[u] };
  }

  /** Currents in the conductors of a segment, flowing from its `from` to its `to` nodes, A. */
  segmentCurrents(index: number): Complex[] {
    const seg = this.segments[index];
    const { from, to } = this.segmentUnknowns[index];
    const n = from.length;
    const dropRe = new Float64Array(n);
    const dropIm = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      dropRe[i] = (from[i] === EARTH ? 0 : this.re[from[i]]) - (to[i] === EARTH ? 0 : this.re[to[i]]);
      dropIm[i] = (from[i] === EARTH ? 0 : this.im[from[i]]) - (to[i] === EARTH ? 0 : this.im[to[i]]);
    }
    const drive = segmentDrive(seg, this.sources(index));
    return seg.coupling.zInv.map((row, i) => {
      let re = 0;
      let im = 0;
      for (let j = 0; j < n; j++) {
        re += row[j].re * dropRe[j] - row[j].im * dropIm[j];
        im += row[j].re * dropIm[j] + row[j].im * dropRe[j];
      }
      return { re: re / seg.lengthM - drive[i].re, im: im / seg.lengthM - drive[i].im };
    });
  }
}
