/**
 * Structured input errors: the system cannot be computed as given. Each error names the
 * element (type and id) and the field at fault, with a stable code from ERROR_CODES.
 * Warnings (computed, but look at this) live in warnings.ts.
 */

export const ERROR_CODES = {
  'schema-violation': 'The system document does not match the system format.',
  'missing-field': 'A required field is missing.',
  'non-finite-number': 'A number is not finite (NaN, Infinity or not a number at all).',
  'non-positive-length': 'A segment length must be greater than zero.',
  'non-positive-diameter': 'An inside diameter must be greater than zero.',
  'value-out-of-range': 'A value is outside the range the engine can compute.',
  'duplicate-id': 'Two elements of the same kind share one id.',
  'unknown-node': 'A reference names a node that is not in the system.',
  'unknown-segment': 'A reference names a segment that is not in the system.',
  'unknown-catalog-entry': 'A material, size, fitting type or fixture type is not in the catalog.',
  'no-source': 'The system has no source node, or the source node is not in the system.',
  'source-has-feed': 'A segment flows into the source node; segments run from the source outward.',
  cycle: 'The segments form a closed loop; Headroom analyses trees only.',
  'multiple-feeds': 'A node is fed by more than one segment; Headroom analyses trees only.',
  'disconnected-segment': 'A segment cannot be reached from the source node.',
  'disconnected-node': 'A node is not connected to the source by any segment.',
  'unknown-fixture': 'No checked fixture in the analysis has this id.',
  'self-loop': 'A segment starts and ends at the same node.',
  'missing-usage-data': 'The binomial demand method needs flow, duration and recurrence for every fixture group.',
  'rise-and-elevation': "A segment has a rise and its downstream node has an elevation or a floor: the node's height would be given twice. Keep one.",
  'node-position-conflict': 'A node has both an elevation and a floor, or a height above floor without a floor: give one position.',
  'unknown-floor': 'A node names a floor that is not in the system.',
  'document-too-large': 'A list or text in the document is longer than any building needs.',
} as const;

export type ErrorCode = keyof typeof ERROR_CODES;

export type ElementType = 'system' | 'source' | 'device' | 'node' | 'segment' | 'fixture-group' | 'checked-fixture' | 'fitting' | 'floor' | 'criteria';

export interface EngineInputErrorJSON {
  name: 'EngineInputError';
  code: ErrorCode;
  elementType: ElementType;
  elementId: string | null;
  field: string | null;
  message: string;
  /** Every problem found by the schema stage, in document order (the first is the one above). */
  issues?: EngineIssue[];
}

export interface EngineIssue {
  code: ErrorCode;
  elementType: ElementType;
  elementId: string | null;
  field: string | null;
  message: string;
  /** JSON path to the value, e.g. ["segments", 3, "length"]. */
  path: (string | number)[];
}

export class EngineInputError extends Error {
  override readonly name = 'EngineInputError';
  readonly code: ErrorCode;
  readonly elementType: ElementType;
  readonly elementId: string | null;
  readonly field: string | null;
  readonly issues: EngineIssue[] | undefined;

  constructor(args: { code: ErrorCode; elementType: ElementType; elementId?: string | null; field?: string | null; message: string; issues?: EngineIssue[] }) {
    super(args.message);
    this.code = args.code;
    this.elementType = args.elementType;
    this.elementId = args.elementId ?? null;
    this.field = args.field ?? null;
    this.issues = args.issues;
  }

  toJSON(): EngineInputErrorJSON {
    const json: EngineInputErrorJSON = {
      name: 'EngineInputError',
      code: this.code,
      elementType: this.elementType,
      elementId: this.elementId,
      field: this.field,
      message: this.message,
    };
    if (this.issues) json.issues = this.issues;
    return json;
  }
}

export function isEngineInputError(value: unknown): value is EngineInputError {
  return value instanceof EngineInputError;
}

/** Shorthand used by the analysis stages. */
export function inputError(code: ErrorCode, elementType: ElementType, elementId: string | null, field: string | null, detail?: string): EngineInputError {
  const where = elementId ? `${elementType} "${elementId}"` : elementType;
  const what = field ? `${where}, field "${field}"` : where;
  return new EngineInputError({
    code,
    elementType,
    elementId,
    field,
    message: `${what}: ${detail ?? ERROR_CODES[code]}`,
  });
}
