/** The lab's known-answer systems (versioned): list, latest, versions, create, update. */
import { systemVersionSchema } from '@/shared/api/work';
import type { SystemSpec } from '@/shared/engine/systems/schema';
import { createResourceHooks, type ResourceVersionOf } from './versioned-resource';

export type SystemRecord = ResourceVersionOf<SystemSpec>;
export const systemsApi = createResourceHooks<SystemSpec>('systems', systemVersionSchema);
export const systemKeys = systemsApi.keys;
