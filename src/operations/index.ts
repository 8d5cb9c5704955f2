/** Every calculation the service offers, in the order the contract lists them. */
import { baseMetalCheck } from './base-metal.js';
import { filletCheck } from './fillet.js';
import type { Operation } from './shared.js';

export const OPERATIONS: readonly Operation[] = [filletCheck as Operation, baseMetalCheck as Operation];
