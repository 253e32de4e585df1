import type { CableTypeInput } from '../src/lib/schemas/bonding-study.schema';

/**
 * Catalogue entries of the demo: illustrative figures and constructions invented for
 * Sheathwise, not any maker's data. The "construction" entries are parsed by the catalogue
 * schema, which derives their resistances, GMR and sheath mean diameter.
 */
export const demoCableTypes: CableTypeInput[] = [
  { id: 'XL132-1000', name: '132 kV 1000 mm² Cu XLPE, aluminium sheath (illustrative data)', conductorResistanceOhmPerKm: 0.0247, conductorGmrMm: 14.6, sheathMeanDiameterMm: 95, sheathResistanceOhmPerKm: 0.09, oversheathThicknessMm: 4.5, overallDiameterMm: 105, oversheathWithstandKv: 20 },
  { id: 'XL132-630', name: '132 kV 630 mm² Al XLPE, copper wire screen (illustrative data)', conductorResistanceOhmPerKm: 0.0625, conductorGmrMm: 11.9, sheathMeanDiameterMm: 82, sheathResistanceOhmPerKm: 0.115, oversheathThicknessMm: 4, overallDiameterMm: 92, oversheathWithstandKv: 20 },
  { id: 'XL33-400', name: '33 kV 400 mm² Al XLPE, copper tape screen (illustrative data)', conductorResistanceOhmPerKm: 0.101, conductorGmrMm: 9.3, sheathMeanDiameterMm: 46, sheathResistanceOhmPerKm: 0.42, oversheathThicknessMm: 2.8, overallDiameterMm: 54, oversheathWithstandKv: 10 },
  {
    id: 'XC132-1000PB',
    name: '132 kV 1000 mm² Cu Milliken XLPE, lead sheath (illustrative construction, not a maker\'s data)',
    entry: 'construction',
    construction: {
      frequencyHz: 50,
      conductor: { material: 'copper', crossSectionMm2: 1000, diameterMm: 38.5, stranding: 'segmental', segmentCount: 5, resistance20OhmPerKm: 0.0176, operatingTemperatureC: 90 },
      screen: { kind: 'tubular', material: 'lead', meanDiameterMm: 90, thicknessMm: 2.8, operatingTemperatureC: 70 },
    },
    oversheathThicknessMm: 4.5,
    overallDiameterMm: 104,
    oversheathWithstandKv: 20,
  },
  {
    id: 'XC132-630CW',
    name: '132 kV 630 mm² Al compacted XLPE, copper wires with aluminium foil (illustrative construction, not a maker\'s data)',
    entry: 'construction',
    construction: {
      frequencyHz: 50,
      conductor: { material: 'aluminium', crossSectionMm2: 630, diameterMm: 30.0, stranding: 'compacted', operatingTemperatureC: 90 },
      screen: { kind: 'wires', material: 'copper', wireCount: 70, wireDiameterMm: 1.5, diameterUnderWiresMm: 78, layLengthMm: 600, foil: { material: 'aluminium', thicknessMm: 0.2 }, operatingTemperatureC: 75 },
    },
    oversheathThicknessMm: 4,
    overallDiameterMm: 92,
    oversheathWithstandKv: 20,
  },
  {
    id: 'XC33-400CW',
    name: '33 kV 400 mm² Al 61-wire XLPE, copper wire screen (illustrative construction, not a maker\'s data)',
    entry: 'construction',
    construction: {
      frequencyHz: 50,
      conductor: { material: 'aluminium', crossSectionMm2: 400, diameterMm: 23.8, stranding: 'stranded', strandCount: 61, operatingTemperatureC: 90 },
      screen: { kind: 'wires', material: 'copper', wireCount: 50, wireDiameterMm: 0.85, diameterUnderWiresMm: 40, layLengthMm: 400, operatingTemperatureC: 80 },
    },
    oversheathThicknessMm: 2.8,
    overallDiameterMm: 50,
    oversheathWithstandKv: 10,
  },
  {
    id: 'XC400-2500AL',
    name: '400 kV 2500 mm² Cu Milliken XLPE, welded aluminium sheath (illustrative construction, not a maker\'s data)',
    entry: 'construction',
    construction: {
      frequencyHz: 50,
      conductor: { material: 'copper', crossSectionMm2: 2500, diameterMm: 61, stranding: 'segmental', segmentCount: 6, operatingTemperatureC: 90 },
      screen: { kind: 'tubular', material: 'aluminium', meanDiameterMm: 135, thicknessMm: 2, operatingTemperatureC: 70 },
    },
    oversheathThicknessMm: 6,
    overallDiameterMm: 150,
    oversheathWithstandKv: 30,
  },
];
