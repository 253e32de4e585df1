import type { CableType } from '../src/lib/schemas/bonding-study.schema';

/** Catalogue entries of the demo: illustrative figures, not any maker's data. */
export const demoCableTypes: CableType[] = [
  { id: 'XL132-1000', name: '132 kV 1000 mm² Cu XLPE, aluminium sheath (illustrative data)', conductorResistanceOhmPerKm: 0.0247, conductorGmrMm: 14.6, sheathMeanDiameterMm: 95, sheathResistanceOhmPerKm: 0.09, oversheathThicknessMm: 4.5, overallDiameterMm: 105, oversheathWithstandKv: 20 },
  { id: 'XL132-630', name: '132 kV 630 mm² Al XLPE, copper wire screen (illustrative data)', conductorResistanceOhmPerKm: 0.0625, conductorGmrMm: 11.9, sheathMeanDiameterMm: 82, sheathResistanceOhmPerKm: 0.115, oversheathThicknessMm: 4, overallDiameterMm: 92, oversheathWithstandKv: 20 },
  { id: 'XL33-400', name: '33 kV 400 mm² Al XLPE, copper tape screen (illustrative data)', conductorResistanceOhmPerKm: 0.101, conductorGmrMm: 9.3, sheathMeanDiameterMm: 46, sheathResistanceOhmPerKm: 0.42, oversheathThicknessMm: 2.8, overallDiameterMm: 54, oversheathWithstandKv: 10 },
];
