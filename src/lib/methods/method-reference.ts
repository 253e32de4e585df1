import { ENGINE_VERSION } from '../calc/constants';
import type { ChecklistItem } from '../calc';

/** The method statement covers a major engine version: a change of method is a new major version. */
export const methodEngineLabel = (engineVersion: string = ENGINE_VERSION): string => `${engineVersion.split('.')[0]}.x`;

/** Where the app serves docs/methods.md. */
export const METHODS_PATH = '/methods';

/** The section of docs/methods.md that says how each checklist criterion's value is computed. */
export const CRITERION_SECTION: Record<ChecklistItem['criterion'], string> = {
  'standing-voltage-normal': '2.3',
  'standing-voltage-emergency': '2.3',
  'joint-voltage-fault': '4.3',
  'loss-factor': '4.2',
  'rating-loss-factor': '4.2',
  'ecc-current-fault': '5',
  'oversheath-fault': '11',
  'svl-continuous': '4.4',
  'svl-tov': '4.4',
  'svl-energy': '4.4',
  'touch-voltage-fault': '9',
  'ecc-thermal': '10',
  'bonding-lead-thermal': '10',
  'metalwork-voltage-normal': '8',
  'induced-emf-fault': '8',
  'ac-current-density': '8',
};

/** The criterion of a stored checklist item key ("standing-voltage-normal:N1", "svl-tov:F1:0"); undefined for manual items. */
export function criterionSection(itemKey: string): string | undefined {
  const criterion = itemKey.split(':')[0];
  return Object.hasOwn(CRITERION_SECTION, criterion) ? CRITERION_SECTION[criterion as ChecklistItem['criterion']] : undefined;
}

export const sectionHref = (section: string): string => `${METHODS_PATH}#section-${section.replace(/\./g, '-')}`;

/** "Sheathwise method statement, engine 2.x, section 4.3", as the record and the checklist cite it. */
export const methodCitation = (section: string, engineVersion?: string): string => `Sheathwise method statement, engine ${methodEngineLabel(engineVersion)}, section ${section}`;
