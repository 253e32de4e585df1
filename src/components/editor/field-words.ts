// A form path told in words for the error list: "sections.1.lengthM" → "Length of section S2".

const FIELD: Record<string, string> = {
  title: 'Title', frequencyHz: 'Frequency', soilResistivityOhmM: 'Soil resistivity', lengthM: 'Length', layoutId: 'Layout', phaseRotation: 'Cable shift',
  id: 'Identifier', name: 'Name', cableTypeId: 'Cable type', formation: 'Formation', spacingM: 'Spacing', depthM: 'Depth', centreXM: 'Offset', xM: 'x', yM: 'y',
  conductorResistanceOhmPerKm: 'Conductor resistance', conductorGmrMm: 'Conductor GMR', sheathMeanDiameterMm: 'Sheath mean diameter', sheathResistanceOhmPerKm: 'Sheath resistance',
  oversheathThicknessMm: 'Oversheath thickness', overallDiameterMm: 'Overall diameter', oversheathWithstandKv: 'Oversheath withstand', ratingLossFactor: 'Loss factor of the rating',
  sectionIds: 'Sections', earthedAt: 'Earthed end', routeStartOhm: 'Earth resistance at the route start', routeEndOhm: 'Earth resistance at the route end', linkBoxOhm: 'Earth resistance at link boxes',
  resistanceOhm: 'Earth resistance', noElectrode: 'No electrode', resistanceOhmPerKm: 'Resistance', gmrMm: 'GMR', fromSectionId: 'First section', toSectionId: 'Last section',
  crossSectionMm2: 'Cross-section', material: 'Material', connection: 'Connection', continuousRatingV: 'Continuous rating', tovRatingV: 'TOV capability',
  conductingResistanceOhm: 'Resistance when conducting', energyRatingKJ: 'Energy rating', jointIndex: 'Joint', currentA: 'Current', angleDeg: 'Angle', durationS: 'Duration',
  kind: 'Kind', circuitId: 'Circuit', phase: 'Phase', phases: 'Phases', beyond: 'Fault beyond', sourceStationShare: 'Share returning through the source station', side: 'Side of the joint',
  chainageM: 'Chainage', fromStart: 'Infeed from the start', fromEnd: 'Infeed from the end', voltageV: 'Station earth potential rise', station: 'Station',
  r: 'Lead resistance', x: 'Lead reactance', bodyWeightKg: 'Body weight', resistivityOhmM: 'Surface layer resistivity', thicknessM: 'Surface layer thickness', initialC: 'Initial temperature', finalC: 'Final temperature',
  parallelLengthM: 'Length of parallelism', earthing: 'Earthing', earthStartOhm: 'Earth resistance at the start', earthEndOhm: 'Earth resistance at the end', screeningFactor: 'Screening factor',
  coatingDefectDiameterMm: 'Coating defect diameter', type: 'Type', sourceId: 'Source',
  transposedAtJoints: 'Transposition joints', transposedAtMidpoint: 'Transposition at the middle', resistanceMilliohmPerM: 'Lead resistance per metre', reactanceMilliohmPerM: 'Lead reactance per metre',
};
const LIST: Record<string, string> = {
  cableTypes: 'cable type', circuits: 'circuit', layouts: 'layout', sections: 'section', bonding: 'bonding group', eccs: 'ECC', svls: 'SVL', cases: 'case',
  overrides: 'earthing override', currents: 'current', positions: 'position', sources: 'source', stationGpr: 'station rise',
  jointNames: 'joint bay', transposedAtJoints: 'transposition joint',
};
const PART: Record<string, string> = { earthing: 'earthing', earthFault: 'earth fault', phasePhaseEarthFault: 'phase-phase-earth fault', internalFault: 'internal fault', bondingLeadMilliohm: 'bonding leads', bondingLeads: 'bonding leads', bondingLeadLength: 'bonding leads by length', touch: 'touch voltage', surfaceLayer: 'surface layer', adiabatic: 'adiabatic check', object: 'the metalwork', fromStart: 'infeed from the start', fromEnd: 'infeed from the end' };

/** Names the field at `path` using the values (ids) the person typed: "Length of section S2". */
export function fieldInWords(path: string, values: unknown): string {
  const keys = path.split('.');
  const owners: string[] = [];
  let field = '';
  let node: unknown = values;
  keys.forEach((k, i) => {
    const next = (node as Record<string, unknown> | undefined)?.[k];
    const isIndex = /^\d+$/.test(k);
    if (isIndex) {
      const list = keys[i - 1];
      const item = (next ?? {}) as Record<string, unknown>;
      const what = LIST[list] ?? list;
      const label = typeof item.id === 'string' && item.id ? item.id : typeof item.circuitId === 'string' ? item.circuitId : typeof item.eccId === 'string' ? item.eccId : typeof item.jointIndex === 'number' ? `at joint ${item.jointIndex}` : String(Number(k) + 1);
      owners.push(`${what} ${label}`);
    } else if (i === keys.length - 1) {
      field = FIELD[k] ?? PART[k] ?? (LIST[k] ? `${LIST[k][0].toUpperCase()}${LIST[k].slice(1)}s` : k);
    } else if (PART[k]) owners.push(PART[k]);
    node = next;
  });
  const whose = owners.reverse().join(' of ');
  if (!field) return whose ? whose[0].toUpperCase() + whose.slice(1) : 'The study';
  return whose ? `${field} of ${whose}` : field;
}
