/**
 * Base metal of a connected part along weld lines (AISC 360-22 §J2.4 with §J4): shear yielding
 * and rupture on the plane along the weld, or tension yielding and rupture when the part is
 * pulled across the weld line.
 */
import { FACTORS, type Method } from './provisions/resistance.js';
import { RnShearRupture, RnShearYield, RnTensionRupture, RnTensionYield } from './provisions/base-metal.js';
import { strengthCheck, summarise, warn, type Check, type EngineResult, type Warning } from './result.js';
import { resolveSteel, type ResolvedSteel, type SteelSpec } from './materials.js';
import { unitSystem, type UnitSystem, type UnitSystemId } from './units.js';

export type Loading = 'shear' | 'tension';

export interface PartAlongWeld {
  thickness: number;
  steel: ResolvedSteel;
  /** 1: welds on one face of the part; 2: welds on both faces along the same line (one shear plane serves both). */
  faces: 1 | 2;
  loading: Loading;
}

export interface BaseMetalValues {
  /** Length of the part's failure plane along the weld (total weld length / faces). */
  planeLength: number;
  /** Gross area of that plane, t × planeLength. */
  area: number;
  fy: number;
  fu: number;
}

/**
 * The base-metal checks of one part whose weld lines total `weldLength`. No holes lie on the
 * plane along a weld, so Anv = Agv and Ae = Ag (U = 1 for a part welded along the line).
 */
export function partChecks(
  method: Method,
  units: UnitSystem,
  part: PartAlongWeld,
  weldLength: number,
  demand: number,
  partIndex?: number,
): { checks: Check[]; values: BaseMetalValues } {
  const planeLength = weldLength / part.faces;
  const area = part.thickness * planeLength;
  const { fy, fu } = part.steel;
  const checks =
    part.loading === 'shear'
      ? [
          strengthCheck('BASE_METAL_SHEAR_YIELD', 'Eq. J4-3', method, RnShearYield(fy, area, units), FACTORS.shearYield, demand, partIndex),
          strengthCheck('BASE_METAL_SHEAR_RUPTURE', 'Eq. J4-4', method, RnShearRupture(fu, area, units), FACTORS.shearRupture, demand, partIndex),
        ]
      : [
          strengthCheck('BASE_METAL_TENSION_YIELD', 'Eq. J4-1', method, RnTensionYield(fy, area, units), FACTORS.tensionYield, demand, partIndex),
          strengthCheck('BASE_METAL_TENSION_RUPTURE', 'Eq. J4-2', method, RnTensionRupture(fu, area, units), FACTORS.tensionRupture, demand, partIndex),
        ];
  return { checks, values: { planeLength, area, fy, fu } };
}

export interface BaseMetalRequest {
  method: Method;
  units: UnitSystemId;
  part: { thickness: number; steel: SteelSpec; faces: 1 | 2; loading: Loading };
  lines: Array<{ length: number; count: number }>;
  /** Required strength through the part; null when not given. */
  demand: number | null;
}

export function checkBaseMetal(req: BaseMetalRequest): EngineResult<BaseMetalValues & { weldLength: number }> {
  const units = unitSystem(req.units);
  const steel = resolveSteel(req.part.steel, req.part.thickness, req.units, '/part/steel');
  const weldLength = req.lines.reduce((sum, l) => sum + l.length * l.count, 0);
  const demand = req.demand ?? 0;
  const { checks, values } = partChecks(req.method, units, { ...req.part, steel }, weldLength, demand);
  const warnings: Warning[] = [];
  if (req.demand === null) warnings.push(warn('NO_DEMAND_GIVEN', 'No load.force given: the answer reports available strengths only.'));
  return summarise(checks, [], warnings, { ...values, weldLength });
}
