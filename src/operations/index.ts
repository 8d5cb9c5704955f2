/** Every calculation the service offers, in the order the contract lists them. */
import { baseMetalCheck } from './base-metal.js';
import { filletCheck } from './fillet.js';
import { filletSize } from './fillet-size.js';
import { cjpCheck, pjpCheck } from './groove.js';
import { plugSlotCheck } from './plug-slot.js';
import type { Operation } from './shared.js';
import { weldGroupEccentric } from './weld-group.js';

export const OPERATIONS: readonly Operation[] = [filletCheck as Operation, filletSize as Operation, baseMetalCheck as Operation, plugSlotCheck as Operation, pjpCheck as Operation, cjpCheck as Operation, weldGroupEccentric as Operation];
