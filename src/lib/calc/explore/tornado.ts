import type { BondingStudy } from '../../schemas/bonding-study.schema';
import type { LimitSet } from '../../schemas/limit-set.schema';
import { ExploreError } from './errors';
import { evaluateStudy } from './evaluate';
import { applyInput, baseValue, inputLabel, type SweepInput } from './sweep';

// Tornado: each input moved alone by its stated ± range from the base study; the bars rank the
// inputs by how far the worst margin moves.

export interface TornadoInput {
  input: SweepInput;
  /** ± range in per cent of the base value. */
  plusMinusPct: number;
}

export interface TornadoBar {
  label: string;
  input: SweepInput;
  lowValue: number;
  highValue: number;
  /** Worst margin (%) with the input at its low and high value; null where it could not be calculated. */
  lowMarginPct: number | null;
  highMarginPct: number | null;
  /** Largest move of the worst margin from the base, percentage points. */
  swingPct: number;
  error?: string;
}

export interface Tornado {
  baseMarginPct: number | null;
  bars: TornadoBar[];
}

export const TORNADO_MAX_INPUTS = 12;

/** Two calculations per input; the bars sorted by swing, largest first. */
export function tornado(base: BondingStudy, limits: LimitSet, inputs: TornadoInput[]): Tornado {
  if (inputs.length < 1 || inputs.length > TORNADO_MAX_INPUTS) throw new ExploreError(`Give between 1 and ${TORNADO_MAX_INPUTS} inputs for the tornado.`, 'inputs');
  const b = evaluateStudy(base, limits, 'checks');
  if (!b.ok) throw new ExploreError(`The study itself cannot be calculated: ${b.error}`, 'study');
  const baseMargin = b.figures.worstMarginPct;
  const bars = inputs.map(({ input, plusMinusPct }, i): TornadoBar => {
    if (!(plusMinusPct > 0 && plusMinusPct < 100)) throw new ExploreError('The ± range must lie between 0 and 100 %.', `inputs.${i}.plusMinusPct`);
    const v = baseValue(base, input);
    if (v === null || !(v > 0)) throw new ExploreError(`${inputLabel(input)}: the study has no value to vary.`, `inputs.${i}.input`);
    const lowValue = v * (1 - plusMinusPct / 100);
    const highValue = v * (1 + plusMinusPct / 100);
    const at = (x: number) => evaluateStudy(applyInput(base, input, x), limits, 'checks');
    const lo = at(lowValue);
    const hi = at(highValue);
    const lowMarginPct = lo.ok ? lo.figures.worstMarginPct : null;
    const highMarginPct = hi.ok ? hi.figures.worstMarginPct : null;
    const moves = [lowMarginPct, highMarginPct].flatMap((m) => (m === null || baseMargin === null ? [] : [Math.abs(m - baseMargin)]));
    const error = !lo.ok ? lo.error : !hi.ok ? hi.error : undefined;
    return { label: inputLabel(input), input, lowValue, highValue, lowMarginPct, highMarginPct, swingPct: moves.length ? Math.max(...moves) : 0, ...(error ? { error } : {}) };
  });
  return { baseMarginPct: baseMargin, bars: bars.sort((p, q) => q.swingPct - p.swingPct) };
}
