import { BadRequestException, Body, Controller, HttpCode, Post } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import type { z } from 'zod';
import { INTERNAL_READ, Roles } from '../common/roles.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiResult } from '../common/openapi';
import { circleFit, eccentricity } from '../../shared/compute/geometry';
import { insulationFromCurrents, stackingFactorByCount, stackingFactorByMass } from '../../shared/compute/steel';
import { ComputeError } from '../../shared/compute/errors';
import {
  circleFitInputSchema,
  circleFitResultSchema,
  eccentricityInputSchema,
  eccentricityResultSchema,
  insulationInputSchema,
  insulationResultSchema,
  stackingFactorByCountInputSchema,
  stackingFactorInputSchema,
  stackingFactorResultSchema,
} from '../../shared/schemas/calc';

function run<T>(fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof ComputeError) throw new BadRequestException({ error: 'validation', message: err.message, fields: { [err.field ?? '_']: err.message } });
    throw err;
  }
}

/** The bench sheet's computations as a calculator: the same shared/ functions, nothing stored. */
@ApiTags('calculators')
@Controller('calc')
export class CalcController {
  @Post('circle-fit')
  @HttpCode(200)
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'Least-squares (Kåsa) circle through probed points' })
  @ApiBody(circleFitInputSchema)
  @ApiResult(circleFitResultSchema)
  circle(@Body(new ZodPipe(circleFitInputSchema)) b: z.infer<typeof circleFitInputSchema>) {
    const f = run(() => circleFit(b.points));
    return { centerX: f.centerX, centerY: f.centerY, diameter: f.diameter, roundness: f.roundness };
  }

  @Post('eccentricity')
  @HttpCode(200)
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'Bore-to-OD eccentricity and coaxiality (2×) from probed points in one frame' })
  @ApiBody(eccentricityInputSchema)
  @ApiResult(eccentricityResultSchema)
  ecc(@Body(new ZodPipe(eccentricityInputSchema)) b: z.infer<typeof eccentricityInputSchema>) {
    const e = run(() => eccentricity(b.bore, b.od));
    return { eccentricity: e.eccentricity, coaxiality: e.coaxiality };
  }

  @Post('stacking-factor')
  @HttpCode(200)
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'Stacking factor = mass / (density × lamination area × stack length)' })
  @ApiBody(stackingFactorInputSchema)
  @ApiResult(stackingFactorResultSchema)
  sf(@Body(new ZodPipe(stackingFactorInputSchema)) b: z.infer<typeof stackingFactorInputSchema>) {
    return { stackingFactor: run(() => stackingFactorByMass(b)) };
  }

  @Post('stacking-factor/by-count')
  @HttpCode(200)
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'Stacking factor from a lamination count = count × nominal thickness / stack length' })
  @ApiBody(stackingFactorByCountInputSchema)
  @ApiResult(stackingFactorResultSchema)
  sfByCount(@Body(new ZodPipe(stackingFactorByCountInputSchema)) b: z.infer<typeof stackingFactorByCountInputSchema>) {
    return { stackingFactor: run(() => stackingFactorByCount(b)) };
  }

  @Post('insulation')
  @HttpCode(200)
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'Surface insulation resistance from Franklin-type test currents (ASTM A717 / IEC 60404-11)' })
  @ApiBody(insulationInputSchema)
  @ApiResult(insulationResultSchema)
  ins(@Body(new ZodPipe(insulationInputSchema)) b: z.infer<typeof insulationInputSchema>) {
    const r = run(() => insulationFromCurrents(b.currentsA));
    // JSON has no Infinity: a perfect insulator (0 A) reports null resistance.
    return { meanCurrentA: r.meanCurrentA, resistanceOhmCm2: Number.isFinite(r.resistanceOhmCm2) ? r.resistanceOhmCm2 : null };
  }
}
