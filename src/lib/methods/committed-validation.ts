import { ENGINE_VERSION } from '../calc/constants';
import type { ValidationReport } from './validation-report';

// The committed validation reports (docs/validation/engine-<version>.json), embedded at build
// time. Vite-only (import.meta.glob): pages use it; scripts run by tsx read the files instead.

const reports = import.meta.glob<ValidationReport>('../../../docs/validation/engine-*.json', { eager: true, import: 'default' });

/** The committed report for an engine version (the running engine's by default), if there is one. */
export function committedValidation(engineVersion: string = ENGINE_VERSION): ValidationReport | undefined {
  return Object.values(reports).find((r) => r.engineVersion === engineVersion);
}
