import { z } from 'zod';
import { MAX_PENDANT_EDGE_POINTS, PENDANT_EDGE_TOO_LONG } from './limits';
import type {
  PendantDropResult,
  PendantEdgeExtraction,
  fittedPendantOutline,
} from '@/lib/tensiometry/pendant-drop';
import type { ProbeLiquidCheck } from '@/lib/tensiometry/water';
import type {
  WilhelmyContactAngleResult,
  WilhelmySurfaceTensionResult,
} from '@/lib/tensiometry/wilhelmy';

/*
 * /api/tensiometry/*: request shapes, shared by the page's forms and the route handlers, and the
 * replies. Lab units: mN, mm, g/cm³, °C, mN/m.
 */

const positive = (label: string, unit: string, maxValue: number) =>
  z
    .number({ error: `Enter the ${label} in ${unit}.` })
    .finite(`Enter the ${label} in ${unit}.`)
    .positive(`The ${label} must be above 0 ${unit}.`)
    .max(maxValue, `The ${label} must be at most ${maxValue} ${unit}.`);

const save = z.boolean({ error: 'save is true or false.' }).default(false);

const wilhelmyBase = {
  forceMilliNewton: z
    .number({ error: 'Enter the balance force in mN.' })
    .finite('Enter the balance force in mN.')
    .min(-10_000, 'The force must be at least −10 000 mN.')
    .max(10_000, 'The force must be at most 10 000 mN.'),
  plateWidthMm: positive('plate width', 'mm', 1000),
  plateThicknessMm: positive('plate thickness', 'mm', 100),
  immersionDepthMm: z
    .number({ error: 'Enter the immersion depth in mm (0 when the plate just touches).' })
    .finite('Enter the immersion depth in mm (0 when the plate just touches).')
    .min(0, 'The immersion depth cannot be negative; use 0 when the plate just touches.')
    .max(100, 'The immersion depth must be at most 100 mm.')
    .default(0),
  liquidDensityGPerCm3: positive('liquid density', 'g/cm³', 30).optional(),
  plateWeightMilliNewton: z
    .number({
      error: 'Enter the plate weight in mN, or 0 when the balance was tared with the plate.',
    })
    .finite()
    .min(0, 'The plate weight cannot be negative.')
    .max(10_000)
    .default(0),
  save,
};

export const wilhelmyTensionSchema = z.object({
  mode: z.literal('tension'),
  ...wilhelmyBase,
  /** θ on the plate; 0 for a roughened platinum plate (common practice). */
  contactAngleDeg: z
    .number({ error: 'Enter the contact angle on the plate in degrees.' })
    .finite()
    .min(0, 'The angle on the plate is between 0° and 89°.')
    .max(89, 'The angle on the plate is between 0° and 89°.')
    .default(0),
});

export const wilhelmyAngleSchema = z.object({
  mode: z.literal('angle'),
  ...wilhelmyBase,
  liquidSurfaceTensionMilliNewtonPerM: positive('liquid surface tension', 'mN/m', 1000),
});

function densityWhenImmersed(
  body: { immersionDepthMm: number; liquidDensityGPerCm3?: number },
  ctx: z.RefinementCtx,
) {
  if (body.immersionDepthMm > 0 && body.liquidDensityGPerCm3 === undefined) {
    ctx.addIssue({
      code: 'custom',
      path: ['liquidDensityGPerCm3'],
      message:
        'The plate is immersed, so the buoyancy correction needs the liquid density (g/cm³). Enter it, or set the depth to 0.',
    });
  }
}

/** POST /api/tensiometry/wilhelmy */
export const wilhelmySchema = z
  .discriminatedUnion('mode', [wilhelmyTensionSchema, wilhelmyAngleSchema], {
    error:
      "Choose the mode: 'tension' (surface tension, θ known) or 'angle' (contact angle, γ known).",
  })
  .superRefine(densityWhenImmersed);
export type WilhelmyInput = z.output<typeof wilhelmySchema>;

/** POST /api/tensiometry/water-check */
export const waterCheckSchema = z.object({
  measuredMilliNewtonPerM: positive('measured surface tension', 'mN/m', 200),
  temperatureC: z
    .number({ error: 'Enter the water temperature in °C.' })
    .finite('Enter the water temperature in °C.')
    .min(0.01, 'IAPWS R1-76 covers 0.01 °C to 373.946 °C; enter a temperature in that range.')
    .max(373.946, 'IAPWS R1-76 covers 0.01 °C to 373.946 °C; enter a temperature in that range.'),
  toleranceMilliNewtonPerM: positive('tolerance', 'mN/m', 20).default(1),
  save,
});
export type WaterCheckInput = z.output<typeof waterCheckSchema>;

export const TENSIOMETRY_KINDS = [
  'wilhelmy-tension',
  'wilhelmy-angle',
  'water-check',
  'pendant-drop',
] as const;
export type TensiometryKind = (typeof TENSIOMETRY_KINDS)[number];

export const tensiometryListQuerySchema = z.object({
  kind: z.enum(TENSIOMETRY_KINDS).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

/** POST /api/tensiometry/pendant-drop: the drop's edge (px) with the needle scale and Δρ. */
export const pendantDropSchema = z.object({
  edge: z
    .array(
      z.object({
        x: z.number({ error: 'Each edge point needs x in px.' }).finite(),
        y: z.number({ error: 'Each edge point needs y in px.' }).finite(),
      }),
      { error: 'Send the edge as a list of { x, y } points in px.' },
    )
    .min(20, 'At least 20 edge points are needed; use a sharper photo with the whole drop in view.')
    .max(MAX_PENDANT_EDGE_POINTS, PENDANT_EDGE_TOO_LONG),
  needleOuterDiameterMm: positive('needle outer diameter', 'mm', 20),
  needleOuterDiameterPx: positive('needle outer diameter in the photo', 'px', 100_000),
  densityDifferenceKgPerM3: positive('density difference', 'kg/m³', 30_000),
  save,
});
export type PendantDropRequest = z.output<typeof pendantDropSchema>;

/**
 * POST /api/tensiometry/pendant-drop with a photo uploaded through the 'dropPhoto' upload route:
 * the server finds the outline and the needle's width in px itself.
 */
export const pendantDropPhotoSchema = z.object({
  photoId: z
    .string({
      error:
        'Send photoId, the id of the hanging-drop photo as the upload returned it; upload the photo first.',
    })
    .trim()
    .min(1, 'Send photoId, the id of the uploaded hanging-drop photo; upload the photo first.')
    .max(100, 'photoId is too long; send the id the upload returned.'),
  needleOuterDiameterMm: positive('needle outer diameter', 'mm', 20),
  densityDifferenceKgPerM3: positive('density difference', 'kg/m³', 30_000),
  edge: z
    .undefined({
      error:
        'Send either photoId (the server finds the outline) or edge with needleOuterDiameterPx, not both.',
    })
    .optional(),
  save,
});
export type PendantDropPhotoRequest = z.output<typeof pendantDropPhotoSchema>;

export type PendantDropBody =
  | ({ source: 'photo' } & Omit<PendantDropPhotoRequest, 'edge'>)
  | ({ source: 'edge' } & PendantDropRequest);

/** Either request form of the pendant-drop route: `photoId` present → the photo form. */
export function parsePendantDropBody(body: Record<string, unknown>): PendantDropBody {
  if (body.photoId === undefined) return { source: 'edge', ...pendantDropSchema.parse(body) };
  const { edge: _edge, ...photo } = pendantDropPhotoSchema.parse(body);
  return { source: 'photo', ...photo };
}

// Responses ------------------------------------------------------------------------------------

/** What a saved result was computed from: the request without `save`. */
export type TensiometryInputs =
  | Omit<WilhelmyInput, 'save'>
  | Omit<WaterCheckInput, 'save'>
  | Omit<PendantDropRequest, 'save'>
  | Omit<PendantDropPhotoRequest, 'save' | 'edge'>;

/** What a saved result holds: the calculation's result (a photo fit adds what was found in it). */
export type TensiometryOutputs =
  | WilhelmySurfaceTensionResult
  | WilhelmyContactAngleResult
  | (ProbeLiquidCheck & { reference: string })
  | PendantDropResult
  | (PendantDropResult & { extraction: PendantDropFromPhoto['extraction'] });

/** A saved tensiometry result with the inputs it was computed from. */
export const tensiometryResultSchema = z.object({
  id: z.string(),
  kind: z.enum(TENSIOMETRY_KINDS),
  inputs: z.custom<TensiometryInputs>(),
  outputs: z.custom<TensiometryOutputs>(),
  /** The photo a pendant-drop result was fitted from, when it came from an uploaded photo. */
  photoId: z.string().nullable(),
  createdByUserId: z.string().nullable(),
  createdByName: z.string().nullable(),
  createdAt: z.coerce.date(),
});
export type TensiometryResult = z.output<typeof tensiometryResultSchema>;
export const tensiometryListResponseSchema = z.object({ items: z.array(tensiometryResultSchema) });

/** POST of a calculation: the result, and the saved row when `save: true`. */
export type CalculationResponse<Result, Extra = object> = Extra & {
  result: Result;
  saved?: TensiometryResult;
};
export type WilhelmyResponse = CalculationResponse<
  WilhelmySurfaceTensionResult | WilhelmyContactAngleResult
>;
export type WaterCheckResponse = CalculationResponse<ProbeLiquidCheck>;
export type PendantDropFromPhoto = {
  photo: { id: string; width: number; height: number };
  extraction: {
    pointCount: number;
    needleOuterDiameterPx: number;
    needleTipY: number;
    warnings: PendantEdgeExtraction['warnings'];
  };
  /** The fitted outline in image pixels, for the overlay. */
  profile: ReturnType<typeof fittedPendantOutline>;
};
export type PendantDropResponse = CalculationResponse<
  PendantDropResult,
  Partial<PendantDropFromPhoto>
>;
