/** The file format's JSON Schema, generated from the zod schema (never written by hand). */
import { z } from 'zod';
import { sectionSchema } from './schema';

export function sectionJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(sectionSchema, { io: 'input', unrepresentable: 'any' }) as Record<string, unknown>;
  return {
    ...schema,
    $id: 'dewline-section.schema.json',
    title: 'Dewline section file, format version 1',
    description: 'A foundation section: parts with their kind parameters, zones with two condition sets, materials, cuts and analysis settings. SI units: metres, W/(m K), degrees C, relative humidity in per cent. x to the right, y up. Generated from lib/section/schema.ts by npm run schema.',
  };
}
