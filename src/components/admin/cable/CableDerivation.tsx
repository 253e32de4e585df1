import { deriveCableParameters } from '../../../lib/calc/cable/derive-cable';
import type { CableConstruction } from '../../../lib/schemas/bonding-study.schema';
import DerivationTable from '../../ui/DerivationTable';

/** Every figure derived from a construction, with its formula, the numbers put in, and its source. */
export default function CableDerivation({ construction, caption }: { construction: CableConstruction; caption: string }) {
  return <DerivationTable figures={deriveCableParameters(construction).figures} caption={caption} testId="cable-derivation" />;
}
