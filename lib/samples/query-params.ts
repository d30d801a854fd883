// Query-string values are text: these turn them into numbers with a message naming the parameter.
import { z } from 'zod';

export function wholeNumberParam(name: string, minimum: number, maximum: number) {
  return z
    .string()
    .regex(/^\d+$/, `${name} must be a whole number`)
    .transform(Number)
    .refine((value) => value >= minimum && value <= maximum, `${name} must be from ${minimum} to ${maximum}`);
}

export function numberParam(name: string) {
  return z
    .string()
    .trim()
    .min(1, `${name} must be a number`)
    .transform(Number)
    .refine(Number.isFinite, `${name} must be a finite number`);
}

export const orderParam = z.enum(['asc', 'desc'], { error: 'order must be asc or desc' });
