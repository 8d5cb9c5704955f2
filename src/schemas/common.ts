/**
 * The shared pieces of the HTTP contract: request envelope fields, the response envelope, and
 * the RFC 9457 problem document. Defined once here; every route composes them.
 */
import { Type, type TSchema, type Static } from 'typebox';
import { CODES, codesOfKind } from '../engine/codes.js';
import { ELECTRODE_NAMES, STEEL_NAMES } from '../engine/materials.js';

/** A string enum rendered as { type: string, enum: [...] } (clean in OpenAPI and for ajv). */
export function StringEnum<const T extends readonly string[]>(values: T, options: Record<string, unknown> = {}) {
  return Type.Unsafe<T[number]>({ type: 'string', enum: [...values], ...options });
}

/** Largest length, thickness or force the contract accepts: well past any real weld, finite. */
export const MAX_MAGNITUDE = 1e7;

/** Smallest length the contract accepts (in or mm): below it no weld or part exists, and strengths underflow. */
export const MIN_LENGTH = 0.001;

/** Smallest stress the contract accepts (ksi or MPa). */
export const MIN_STRESS = 1;

export const FRACTION_PATTERN = '^\\s*(\\d+[ -])?\\d+/\\d+\\s*$|^\\s*\\d+(\\.\\d+)?\\s*$';

export const Method = StringEnum(['LRFD', 'ASD'] as const, {
  description: 'Design method. Required: a safety calculation has no silent default. LRFD compares factored demand with phi·Rn; ASD compares service demand with Rn/Omega.',
});
export const Units = StringEnum(['imperial', 'metric'] as const, {
  description: 'Unit system of every number in the request and answer: imperial (in, kip, ksi) or metric (mm, kN, MPa). Default imperial.',
});
export const Id = Type.String({ minLength: 1, maxLength: 128, description: 'Caller\'s identifier (BIM element id, spreadsheet row key), echoed back unchanged.' });

/** Header fields of the calculation sheet (format=html or pdf). The calculation never reads them. */
const SheetText = (max: number, description: string) => Type.String({ maxLength: max, description });
export const SheetFields = Type.Object(
  {
    project: Type.Optional(SheetText(200, 'Project name.')),
    mark: Type.Optional(SheetText(128, 'Connection mark, such as WS-B12. Default: id.')),
    preparedBy: Type.Optional(SheetText(100, 'Who prepared the calculation.')),
    checkedBy: Type.Optional(SheetText(100, 'Who checked it.')),
    date: Type.Optional(SheetText(40, 'Date as it should read on the sheet. The service prints no date of its own, so the same request gives the same sheet.')),
  },
  { additionalProperties: false, description: 'Header of the calculation sheet (format=html or pdf): project, connection mark, prepared by, checked by, date. Not used by the calculation.' },
);

/** A positive length in the request's unit; in imperial also a fraction string like "5/16" or "1-1/4". */
export function Length(description: string) {
  return Type.Union(
    [
      Type.Number({ minimum: MIN_LENGTH, maximum: MAX_MAGNITUDE }),
      Type.String({ pattern: FRACTION_PATTERN, maxLength: 32, description: 'Imperial fraction such as "5/16", "1-1/4" or "1 1/4" (imperial only).' }),
    ],
    { description },
  );
}

export const Steel = Type.Union(
  [
    StringEnum(STEEL_NAMES as readonly string[], { description: 'Catalogue grade (GET /v1/catalog/steels).' }),
    Type.Object(
      {
        fy: Type.Number({ minimum: MIN_STRESS, maximum: 10000, description: 'Specified minimum yield stress, ksi or MPa.' }),
        fu: Type.Number({ minimum: MIN_STRESS, maximum: 10000, description: 'Specified minimum tensile strength, ksi or MPa.' }),
      },
      { additionalProperties: false },
    ),
  ],
  { description: 'Steel by catalogue name, or its fy and fu in the request\'s stress unit.' },
);

export const Electrode = Type.Union(
  [
    StringEnum(ELECTRODE_NAMES as readonly string[], { description: 'Electrode classification (GET /v1/catalog/electrodes); E70 = 70 ksi, metric E49 = 490 MPa.' }),
    Type.Object(
      { fexx: Type.Number({ minimum: MIN_STRESS, maximum: 10000, description: 'Filler metal classification strength FEXX, ksi or MPa.' }) },
      { additionalProperties: false },
    ),
  ],
  { description: 'Filler metal by classification, or FEXX in the request\'s stress unit.' },
);

export const Load = Type.Object(
  { force: Type.Number({ minimum: 0, maximum: 1e9, description: 'Required strength of the whole joint, kip or kN (factored for LRFD, service for ASD).' }) },
  { additionalProperties: false, description: 'The demand. Omit it to get available strengths only.' },
);

// ---------------------------------------------------------------- response envelope

export const CheckCode = StringEnum(codesOfKind('check'), { description: 'Strength limit state code (see the README code table).' });
export const LimitCode = StringEnum(codesOfKind('limit'), { description: 'Detailing rule code.' });
export const WarningCode = StringEnum(codesOfKind('warning'), { description: 'Advice code.' });
export const ErrorCode = StringEnum(codesOfKind('error'), { description: 'Why the rules cannot answer the request.' });

export const CheckItem = Type.Object(
  {
    code: CheckCode,
    title: Type.String(),
    clause: Type.String({ description: 'Provision, e.g. "AISC 360-22 §J2.4".' }),
    equation: Type.String({ description: 'Equation reference, e.g. "Eq. J2-4".' }),
    part: Type.Optional(Type.Integer({ description: 'Index into parts[] for a base-metal check.' })),
    nominal: Type.Number({ description: 'Nominal strength Rn.' }),
    phi: Type.Optional(Type.Number({ description: 'Resistance factor (LRFD).' })),
    omega: Type.Optional(Type.Number({ description: 'Safety factor (ASD).' })),
    available: Type.Number({ description: 'phi·Rn (LRFD) or Rn/Omega (ASD).' }),
    demand: Type.Number(),
    ratio: Type.Number({ description: 'demand / available.' }),
    pass: Type.Boolean(),
    applicable: Type.Optional(Type.Boolean({ description: 'false when the Specification says this limit state need not be checked for the load (AISC 360-22 Table J2.5); nominal, available and ratio are then 0 and note says why. Absent means true.' })),
    note: Type.Optional(Type.String({ description: 'Why a check is not applicable, or how it was taken.' })),
  },
  { additionalProperties: false },
);

export const LimitItem = Type.Object(
  {
    code: LimitCode,
    title: Type.String(),
    clause: Type.String(),
    weld: Type.Optional(Type.Integer({ description: 'Index into welds[] the rule is about.' })),
    part: Type.Optional(Type.Integer({ description: 'Index into parts[] the rule is about.' })),
    required: Type.Number(),
    provided: Type.Number(),
    sense: StringEnum(['min', 'max'] as const, { description: 'min: provided must be at least required; max: at most.' }),
    pass: Type.Boolean(),
    note: Type.Optional(Type.String()),
  },
  { additionalProperties: false },
);

export const WarningItem = Type.Object({ code: WarningCode, message: Type.String() }, { additionalProperties: false });

export const Governing = Type.Object(
  {
    code: CheckCode,
    part: Type.Optional(Type.Integer()),
    available: Type.Number(),
    demand: Type.Number(),
    ratio: Type.Number(),
  },
  { additionalProperties: false, description: 'The strength limit state with the highest demand/available ratio (with no demand, the lowest available strength).' },
);

export const UnitsOut = Type.Object(
  {
    length: StringEnum(['in', 'mm'] as const),
    force: StringEnum(['kip', 'kN'] as const),
    stress: StringEnum(['ksi', 'MPa'] as const),
  },
  { additionalProperties: false },
);

export const Basis = Type.Object(
  {
    standard: Type.String(),
    method: Method,
    engine: Type.String({ description: 'Engine version: the same request gives the same answer from the same version.' }),
  },
  { additionalProperties: false },
);

/** The response envelope of every calculation, with the family's own `values`. */
export function Envelope<V extends TSchema>(name: string, values: V) {
  return Type.Object(
    {
      id: Type.Optional(Type.String()),
      status: StringEnum(['pass', 'fail'] as const, { description: 'fail when any strength ratio exceeds 1 or any detailing limit is violated.' }),
      utilization: Type.Number({ description: 'Largest demand/available ratio among the strength checks.' }),
      governing: Governing,
      checks: Type.Array(CheckItem),
      limits: Type.Array(LimitItem),
      warnings: Type.Array(WarningItem),
      values,
      units: UnitsOut,
      basis: Basis,
      notice: Type.String({ description: 'The caution: review by a licensed engineer under the governing local code.' }),
    },
    { additionalProperties: false, $id: name, title: name },
  );
}

// ---------------------------------------------------------------- problems (RFC 9457)

export const Problem = Type.Object(
  {
    type: Type.String({ description: 'URI naming the kind of problem.' }),
    title: Type.String(),
    status: Type.Integer(),
    detail: Type.String(),
    instance: Type.Optional(Type.String()),
    code: Type.Optional(ErrorCode),
    pointer: Type.Optional(Type.String({ description: 'For 422: JSON pointer of the request field at fault, when there is one.' })),
    errors: Type.Optional(
      Type.Array(
        Type.Object(
          {
            pointer: Type.String({ description: 'JSON pointer of the offending field in the request (query fields mapped to the same pointers).' }),
            detail: Type.String({ description: 'What was expected.' }),
          },
          { additionalProperties: false },
        ),
      ),
    ),
  },
  { additionalProperties: false, $id: 'Problem', title: 'Problem', description: 'RFC 9457 problem details.' },
);
export type ProblemBody = Static<typeof Problem>;

export const CODE_COUNT = Object.keys(CODES).length;
