import { Body, Controller, Get, HttpCode, Param, Patch, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';
import { INTERNAL_READ, Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { PlansService } from './plans.service';
import { idParamSchema, pageOf } from '../../shared/schemas/common';
import type { SessionUser } from '../../shared/schemas/auth';
import {
  createPlanSchema,
  fromTemplateSchema,
  planActionSchema,
  planChangeSchema,
  planListQuerySchema,
  planSchema,
  updatePlanSchema,
  type Plan,
  type PlanSummary,
  type UpdatePlanInput,
} from '../../shared/schemas/master-data';

/** Routes that take no input still refuse unexpected fields. */
const emptyBodySchema = z.object({}).strict().default({});
const changesQuerySchema = z.object({ against: z.uuid({ message: 'against must be a plan id' }).optional() });
const planRefSchema = z.object({ id: z.string(), revision: z.number(), status: z.string() });
const planSummarySchema = planSchema.omit({ characteristics: true }).extend({ characteristicCount: z.number() });

@ApiTags('plans')
@Controller()
export class PlansController {
  constructor(private readonly plans: PlansService) {}

  @Get('plans')
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'Inspection plans, paged; filter by part and status' })
  @ApiQueryOf(planListQuerySchema)
  @ApiResult(pageOf(planSummarySchema))
  list(@Query(new ZodPipe(planListQuerySchema)) q: z.infer<typeof planListQuerySchema>): Promise<{ items: PlanSummary[]; total: number }> {
    return this.plans.list(q);
  }

  @Get('plans/:id')
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'One plan revision with its characteristics' })
  @ApiResult(planSchema)
  get(@Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<Plan> {
    return this.plans.get(p.id);
  }

  @Get('plans/:id/changes')
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'What changed from the revision this one came from (or ?against=<plan id>)' })
  @ApiQueryOf(changesQuerySchema)
  @ApiResult(z.object({ from: planRefSchema.nullable(), to: planRefSchema, changes: z.array(planChangeSchema) }))
  changes(@Param(new ZodPipe(idParamSchema)) p: { id: string }, @Query(new ZodPipe(changesQuerySchema)) q: z.infer<typeof changesQuerySchema>) {
    return this.plans.changes(p.id, q.against);
  }

  @Post('plans')
  @Roles('engineer')
  @ApiOperation({ summary: 'A new draft plan for a part revision' })
  @ApiBody(createPlanSchema)
  @ApiResult(planSchema, 201)
  create(@CurrentUser() user: SessionUser, @Body(new ZodPipe(createPlanSchema)) body: z.output<typeof createPlanSchema>): Promise<Plan> {
    return this.plans.create(user, body);
  }

  @Patch('plans/:id')
  @Roles('engineer')
  @ApiOperation({ summary: 'Change a draft (409 for active or superseded plans: revise them instead)' })
  @ApiBody(updatePlanSchema)
  @ApiResult(planSchema)
  update(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(updatePlanSchema)) body: UpdatePlanInput): Promise<Plan> {
    return this.plans.update(user, p.id, body);
  }

  @Post('plans/:id/activate')
  @HttpCode(200)
  @Roles('engineer')
  @ApiOperation({ summary: 'Activate a draft; the previous active plan of the part is superseded' })
  @ApiBody(planActionSchema)
  @ApiResult(planSchema)
  activate(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(planActionSchema)) body: { version: number }): Promise<Plan> {
    return this.plans.activate(user, p.id, body.version);
  }

  @Post('plans/:id/revise')
  @Roles('engineer')
  @ApiOperation({ summary: 'Copy this plan into a new draft revision (empty body)' })
  @ApiBody(emptyBodySchema)
  @ApiResult(planSchema, 201)
  revise(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(emptyBodySchema)) _body: object): Promise<Plan> {
    return this.plans.revise(user, p.id);
  }

  @Get('plan-templates')
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'Starting points per core construction' })
  @ApiResult(z.array(z.object({ id: z.string(), name: z.string(), description: z.string() })))
  templates() {
    return this.plans.templates();
  }

  @Post('plans/from-template')
  @Roles('engineer')
  @ApiOperation({ summary: 'A new draft plan filled from a construction template, sized from the part' })
  @ApiBody(fromTemplateSchema)
  @ApiResult(planSchema, 201)
  fromTemplate(@CurrentUser() user: SessionUser, @Body(new ZodPipe(fromTemplateSchema)) body: z.infer<typeof fromTemplateSchema>): Promise<Plan> {
    return this.plans.fromTemplate(user, body.partId, body.template);
  }
}
