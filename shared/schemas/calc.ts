import { z } from 'zod';

const num = (label: string) => z.number({ message: `${label} must be a number` }).finite(`${label} must be finite`);
const pos = (label: string) => num(label).positive(`${label} must be greater than zero`);
const point = z.tuple([num('x'), num('y')], { message: 'each point is [x, y]' });

export const circleFitInputSchema = z.object({ points: z.array(point).min(3, 'a circle needs at least 3 points').max(10000) }).strict();
export const circleFitResultSchema = z.object({ centerX: z.number(), centerY: z.number(), diameter: z.number(), roundness: z.number() });
export const eccentricityInputSchema = z.object({ bore: z.array(point).min(3, 'the bore needs at least 3 points').max(10000), od: z.array(point).min(3, 'the OD needs at least 3 points').max(10000) }).strict();
export const eccentricityResultSchema = z.object({ eccentricity: z.number(), coaxiality: z.number() });
export const stackingFactorInputSchema = z.object({ massG: pos('massG'), densityGcm3: pos('densityGcm3'), areaCm2: pos('areaCm2'), stackLengthMm: pos('stackLengthMm') }).strict();
export const stackingFactorResultSchema = z.object({ stackingFactor: z.number() });
export const stackingFactorByCountInputSchema = z
  .object({
    laminationCount: z.number({ message: 'laminationCount must be a number' }).int('laminationCount must be a whole number').min(1, 'laminationCount must be at least 1').max(100_000, 'laminationCount must be at most 100 000'),
    thicknessMm: pos('thicknessMm'),
    stackLengthMm: pos('stackLengthMm'),
  })
  .strict();
export const insulationInputSchema = z
  .object({ currentsA: z.array(num('current').min(0, 'a Franklin current is between 0 and 1 A').max(1, 'a Franklin current is between 0 and 1 A')).min(1, 'give at least one current').max(1000) })
  .strict();
export const insulationResultSchema = z.object({ meanCurrentA: z.number(), resistanceOhmCm2: z.number().nullable() });
