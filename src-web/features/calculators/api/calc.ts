import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import type {
  circleFitInputSchema,
  circleFitResultSchema,
  eccentricityInputSchema,
  eccentricityResultSchema,
  insulationInputSchema,
  insulationResultSchema,
  stackingFactorByCountInputSchema,
  stackingFactorInputSchema,
  stackingFactorResultSchema,
} from '@shared/schemas/calc';
import { api } from '../../../lib/api-client';

export type CircleFitInput = z.infer<typeof circleFitInputSchema>;
export type CircleFitResult = z.infer<typeof circleFitResultSchema>;
export type EccentricityInput = z.infer<typeof eccentricityInputSchema>;
export type EccentricityResult = z.infer<typeof eccentricityResultSchema>;
export type StackingFactorInput = z.infer<typeof stackingFactorInputSchema>;
export type StackingFactorResult = z.infer<typeof stackingFactorResultSchema>;
export type StackingFactorByCountInput = z.infer<typeof stackingFactorByCountInputSchema>;
export type InsulationInput = z.infer<typeof insulationInputSchema>;
export type InsulationResult = z.infer<typeof insulationResultSchema>;

// The calculators compute and store nothing: each is a POST only because its input is a body.
export const checkCircleFit = (input: CircleFitInput) => api<CircleFitResult>('/calc/circle-fit', { method: 'POST', body: input });
export const checkEccentricity = (input: EccentricityInput) => api<EccentricityResult>('/calc/eccentricity', { method: 'POST', body: input });
export const checkStackingFactor = (input: StackingFactorInput) => api<StackingFactorResult>('/calc/stacking-factor', { method: 'POST', body: input });
export const checkStackingFactorByCount = (input: StackingFactorByCountInput) => api<StackingFactorResult>('/calc/stacking-factor/by-count', { method: 'POST', body: input });
export const checkInsulation = (input: InsulationInput) => api<InsulationResult>('/calc/insulation', { method: 'POST', body: input });

export const useCheckCircleFit = () => useMutation({ mutationFn: checkCircleFit });
export const useCheckEccentricity = () => useMutation({ mutationFn: checkEccentricity });
export const useCheckStackingFactor = () => useMutation({ mutationFn: checkStackingFactor });
export const useCheckStackingFactorByCount = () => useMutation({ mutationFn: checkStackingFactorByCount });
export const useCheckInsulation = () => useMutation({ mutationFn: checkInsulation });
