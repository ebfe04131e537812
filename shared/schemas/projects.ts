import { z } from 'zod';
import { imageFileProblem, optionalText, patchOf, requiredText } from './common';

export const projectInput = z.object({
  code: requiredText(40),
  name: requiredText(160),
  organizationId: z.number().int().positive(),
  site: requiredText(160),
  address: optionalText(300),
  notes: optionalText(2000),
});
export type ProjectInput = z.infer<typeof projectInput>;
export const projectPatch = patchOf(projectInput);

export interface Project extends ProjectInput {
  id: number;
  organizationName: string;
  createdAt: string;
  updatedAt: string;
}

const coordinate = (min: number, max: number) => z.number().min(min).max(max).nullable().default(null);

/** What a location's site plan may be: checked from the content on the server. */
export const SITE_PLAN_TYPES = ['image/png', 'image/jpeg'] as const;
export const SITE_PLAN_MAX_BYTES = 10 * 1024 * 1024;

/** Why a chosen file cannot be a site plan, or null when it can. */
export const sitePlanFileProblem = (file: { type: string; size: number }) =>
  imageFileProblem(file, { types: SITE_PLAN_TYPES, maxBytes: SITE_PLAN_MAX_BYTES, words: 'PNG or JPEG' });

export const locationInput = z.object({
  pitId: requiredText(40),
  latitude: coordinate(-90, 90),
  longitude: coordinate(-180, 180),
  /** Pin on the uploaded site plan, as fractions of its width and height. */
  planX: coordinate(0, 1),
  planY: coordinate(0, 1),
  testDepthM: z.number().min(0).max(50),
  waterTableDepthM: z.number().min(0).max(200).nullable().default(null),
  pitWidthM: z.number().positive().max(50).nullable().default(null),
  soilDescription: optionalText(1000),
  notes: optionalText(2000),
});
export type LocationInput = z.infer<typeof locationInput>;
export const locationPatch = patchOf(locationInput);

export interface TestLocation extends LocationInput {
  id: number;
  projectId: number;
  sitePlanFile: string | null;
  createdAt: string;
  updatedAt: string;
}
