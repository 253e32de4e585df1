import { queryOptions } from '@tanstack/react-query';
import { api } from './api-client';
import type { CableType } from '../schemas/bonding-study.schema';

export const cableCatalogueQuery = () =>
  queryOptions({ queryKey: ['cable-types'], queryFn: () => api<{ cableTypes: Array<{ id: string; code: string; data: CableType }> }>('/api/cable-types') });
