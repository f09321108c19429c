import { Inject, Injectable, PayloadTooLargeException, UnsupportedMediaTypeException } from '@nestjs/common';
import { and, count, eq, ilike, or } from 'drizzle-orm';
import { now as clockNow } from '../common/clock';
import { DB, type Db } from '../db/client';
import { inspectionPlan, part } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { StorageService } from '../storage/storage.service';
import { conflict, isUniqueViolation, notFound, stale } from '../common/errors';
import { likeEscape, offsetOf, orderFrom } from '../common/paging';
import { ValidationFailed } from '../common/zod.pipe';
import { sniff } from '../common/file-sniff';
import { parseSteelGrade, defaultDensity } from '../../shared/compute/steel';
import { ComputeError } from '../../shared/compute/errors';
import type { SessionUser } from '../../shared/schemas/auth';
import type { CreatePartInput, Part, UpdatePartInput, partListQuerySchema } from '../../shared/schemas/master-data';
import type { z } from 'zod';

type Row = typeof part.$inferSelect;
export const MAX_DRAWING_BYTES = 20 * 1024 * 1024;

export function toPart(r: Row, activePlanId: string | null = null): Part {
  return {
    id: r.id,
    partNumber: r.partNumber,
    revision: r.revision,
    description: r.description,
    construction: r.construction,
    steelGrade: r.steelGrade,
    lossWPerKg: r.lossWPerKg,
    gradeThicknessMm: r.gradeThicknessMm,
    laminationThicknessMm: r.laminationThicknessMm,
    laminationAreaCm2: r.laminationAreaCm2,
    densityGcm3: r.densityGcm3,
    densitySource: r.densitySource,
    nominalBoreMm: r.nominalBoreMm,
    nominalOdMm: r.nominalOdMm,
    nominalStackLengthMm: r.nominalStackLengthMm,
    slotCount: r.slotCount,
    nominalMassKg: r.nominalMassKg,
    designStackingFactor: r.designStackingFactor,
    designToothT: r.designToothT,
    designYokeT: r.designYokeT,
    drawing: r.drawingKey && r.drawingName ? { name: r.drawingName, size: r.drawingSize ?? 0 } : null,
    activePlanId,
    version: r.version,
    updatedAt: r.updatedAt.toISOString(),
  };
}

/** Grade name → loss class and thickness; the density defaults from the grade unless given. */
function gradeFields(steelGrade: string, densityGcm3: number | null | undefined) {
  try {
    const g = parseSteelGrade(steelGrade);
    const d = densityGcm3 ?? null;
    const dflt = defaultDensity(g.designation);
    return {
      steelGrade: g.designation,
      lossWPerKg: g.lossWPerKg,
      gradeThicknessMm: g.thicknessMm,
      densityGcm3: d ?? dflt.density,
      densitySource: d == null ? `${dflt.basis}` : 'set by engineer',
    };
  } catch (err) {
    if (err instanceof ComputeError) throw new ValidationFailed({ steelGrade: err.message });
    throw err;
  }
}

@Injectable()
export class PartsService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
    private readonly storage: StorageService,
  ) {}

  private get activePlan() {
    return this.db
      .select({ partId: inspectionPlan.partId, planId: inspectionPlan.id })
      .from(inspectionPlan)
      .where(eq(inspectionPlan.status, 'active'))
      .as('active_plan');
  }

  async list(q: z.infer<typeof partListQuerySchema>, shippedBy?: string[]): Promise<{ items: Part[]; total: number }> {
    const where = and(
      q.q ? or(ilike(part.partNumber, likeEscape(q.q)), ilike(part.description, likeEscape(q.q))) : undefined,
      q.construction ? eq(part.construction, q.construction) : undefined,
      shippedBy ? (shippedBy.length ? or(...shippedBy.map((id) => eq(part.id, id))) : eq(part.id, '00000000-0000-0000-0000-000000000000')) : undefined,
    );
    const ap = this.activePlan;
    const rows = await this.db
      .select({ p: part, planId: ap.planId })
      .from(part)
      .leftJoin(ap, eq(ap.partId, part.id))
      .where(where)
      .orderBy(...orderFrom(q.sort, { partNumber: part.partNumber, construction: part.construction, updatedAt: part.updatedAt }, part.partNumber))
      .limit(q.pageSize)
      .offset(offsetOf(q.page, q.pageSize));
    const [{ n }] = await this.db.select({ n: count() }).from(part).where(where);
    return { items: rows.map((r) => toPart(r.p, r.planId)), total: n };
  }

  async get(id: string): Promise<Part> {
    const ap = this.activePlan;
    const [row] = await this.db.select({ p: part, planId: ap.planId }).from(part).leftJoin(ap, eq(ap.partId, part.id)).where(eq(part.id, id));
    if (!row) throw notFound('part');
    return toPart(row.p, row.planId);
  }

  async create(actor: SessionUser, input: CreatePartInput): Promise<Part> {
    const grade = gradeFields(input.steelGrade, input.densityGcm3);
    try {
      return await this.db.transaction(async (tx) => {
        const [row] = await tx
          .insert(part)
          .values({
            partNumber: input.partNumber,
            revision: input.revision,
            description: input.description,
            construction: input.construction,
            ...grade,
            laminationThicknessMm: input.laminationThicknessMm,
            laminationAreaCm2: input.laminationAreaCm2,
            nominalBoreMm: input.nominalBoreMm,
            nominalOdMm: input.nominalOdMm,
            nominalStackLengthMm: input.nominalStackLengthMm,
            slotCount: input.slotCount,
            nominalMassKg: input.nominalMassKg,
            designStackingFactor: input.designStackingFactor ?? null,
            designToothT: input.designToothT ?? null,
            designYokeT: input.designYokeT ?? null,
          })
          .returning();
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'part.created', entity: 'part', entityId: row.id, after: toPart(row) });
        return row.id;
      }).then((id) => this.get(id));
    } catch (err) {
      if (isUniqueViolation(err)) throw conflict(`Part ${input.partNumber} revision ${input.revision} already exists`, { revision: 'This part number already has this revision' });
      throw err;
    }
  }

  async update(actor: SessionUser, id: string, input: UpdatePartInput): Promise<Part> {
    return this.db.transaction(async (tx) => {
      const [before] = await tx.select().from(part).where(eq(part.id, id)).for('update');
      if (!before) throw notFound('part');
      if (before.version !== input.version) throw stale('part');
      const bore = input.nominalBoreMm ?? before.nominalBoreMm;
      const od = input.nominalOdMm ?? before.nominalOdMm;
      if (bore >= od) throw new ValidationFailed({ nominalBoreMm: 'The bore must be smaller than the OD' });
      const gradeChanged = input.steelGrade !== undefined || input.densityGcm3 !== undefined;
      const grade = gradeChanged
        ? gradeFields(input.steelGrade ?? before.steelGrade, input.densityGcm3 !== undefined ? input.densityGcm3 : before.densitySource === 'set by engineer' ? before.densityGcm3 : null)
        : {};
      const { version: _v, ...rest } = input;
      const [row] = await tx
        .update(part)
        .set({ ...rest, ...grade, version: before.version + 1, updatedAt: clockNow() } as Partial<Row>)
        .where(eq(part.id, id))
        .returning();
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'part.updated', entity: 'part', entityId: id, before: toPart(before), after: toPart(row) });
    }).then(() => this.get(id));
  }

  async attachDrawing(actor: SessionUser, id: string, file: { buffer: Buffer; originalname: string; size: number } | undefined): Promise<Part> {
    if (!file) throw new ValidationFailed({ file: 'Attach the drawing as a PDF' });
    if (file.size > MAX_DRAWING_BYTES) throw new PayloadTooLargeException({ error: 'too_large', message: 'A drawing may be at most 20 MB' });
    if (sniff(file.buffer) !== 'pdf') throw new UnsupportedMediaTypeException({ error: 'unsupported_media_type', message: 'The drawing must be a PDF file' });
    const [existing] = await this.db.select().from(part).where(eq(part.id, id));
    if (!existing) throw notFound('part');
    const key = this.storage.newKey('drawings');
    await this.storage.put(key, file.buffer, 'application/pdf');
    try {
      return await this.db.transaction(async (tx) => {
        const [row] = await tx
          .update(part)
          .set({ drawingKey: key, drawingName: file.originalname.slice(0, 120), drawingSize: file.size, version: existing.version + 1, updatedAt: clockNow() })
          .where(eq(part.id, id))
          .returning();
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'part.drawing_attached', entity: 'part', entityId: id, before: { drawing: existing.drawingName }, after: { drawing: row.drawingName, size: file.size } });
      }).then(() => this.get(id));
    } catch (err) {
      await this.storage.delete(key); // no orphan object when the row did not change
      throw err;
    }
  }

  async drawing(id: string) {
    const [row] = await this.db.select().from(part).where(eq(part.id, id));
    if (!row || !row.drawingKey) throw notFound('drawing');
    return { name: row.drawingName ?? 'drawing.pdf', ...(await this.storage.get(row.drawingKey)) };
  }
}
