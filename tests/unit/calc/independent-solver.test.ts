import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';
import { buildBondingNetwork } from '../../../src/lib/calc/bonding/network-model';
import { caseSources } from '../../../src/lib/calc/bonding/case-sources';
import { type Complex, abs, sub } from '../../../src/lib/calc/complex';
import { EARTH } from '../../../src/lib/calc/network';
import { math, solveWithMathjs } from '../../helpers/dense-reference';

// mathjs (a general-purpose library, dense complex LU) solves the same assembled system the
// banded solver solves; node voltages and branch currents must agree to 1e-8 relative.

const fixtures = ['fernhollow-cross-bonded', 'kestrel-single-point-ecc'];

const close = (a: Complex, b: Complex, scale: number) => abs(sub(a, b)) / Math.max(scale, 1e-300);

describe('banded solve against mathjs dense complex LU', () => {
  for (const name of fixtures) {
    it(`${name}: every case, every node and branch`, () => {
      const study = bondingStudySchema.parse(JSON.parse(readFileSync(`tests/fixtures/studies/${name}.json`, 'utf8')));
      const model = buildBondingNetwork(study);
      const network = model.builder.compile();
      let compared = 0;
      for (const c of study.cases) {
        const sources = caseSources(study, model, c);
        const ours = network.solve(sources);
        const dense = solveWithMathjs(network, sources);
        const at = (node: number): Complex => (network.unknownOf(node) === EARTH ? { re: 0, im: 0 } : dense[network.unknownOf(node)]);
        const vScale = Math.max(...dense.map(abs));
        model.jointNodes.forEach((j) => {
          for (const node of [...j.left, ...j.right, ...j.ecc.values()]) {
            expect(close(ours.voltage(node), at(node), vScale)).toBeLessThan(1e-8);
            compared++;
          }
        });
        // Branch currents from mathjs's voltages: I = inv(Z·L)·(V_from − V_to) − inv(Z)·Z_ms·I_s, multiplied by mathjs.
        model.builder.segments.forEach((seg, k) => {
          const drop = seg.from.map((f, i) => sub(at(f), at(seg.to[i])));
          const y = math.divide(toMath(seg.coupling.zInv), seg.lengthM);
          const drive = math.multiply(toMath(seg.coupling.sourceGain), seg.coupling.sourceIndices.map((s) => [math.complex(sources[s].re, sources[s].im)]));
          const currents = math.subtract(math.multiply(y, drop.map((d) => [math.complex(d.re, d.im)])), drive) as unknown as Array<[{ re: number; im: number }]>;
          const oursI = ours.segmentCurrents(k);
          const iScale = Math.max(...oursI.map(abs), 1);
          currents.forEach(([z], i) => expect(close(oursI[i], { re: z.re, im: z.im }, iScale)).toBeLessThan(1e-8));
        });
      }
      expect(compared).toBeGreaterThan(20);
    });
  }
});

const toMath = (m: Complex[][]) => m.map((row) => row.map((z) => math.complex(z.re, z.im)));
