import { z } from 'zod';

/**
 * Request body for SPC analysis (shared/compute/spc/analyze.ts). The refinements repeat the
 * checks the computation makes so a form can show them beside the field before submitting.
 */

const measurement = z.number({ message: 'each measurement must be a finite number' });
const count = (label: string) =>
  z.number({ message: `${label} must be a number` }).int(`${label} must be a whole number`);

export const spcChartSchema = z.enum(['xbar-r', 'xbar-s', 'i-mr', 'p'], {
  message: 'chart must be one of xbar-r, xbar-s, i-mr, p',
});
export const spcRuleSetSchema = z.enum(['western-electric', 'nelson'], {
  message: 'rules must be western-electric or nelson',
});

const CHART_LABEL = { 'xbar-r': 'an X-bar/R chart', 'xbar-s': 'an X-bar/s chart', 'i-mr': 'an individuals chart', p: 'a p chart' } as const;

export const spcAnalyzeInputSchema = z
  .object({
    chart: spcChartSchema,
    subgroups: z.array(z.array(measurement, { message: 'each subgroup must be a list of measurements' }), {
      message: 'subgroups must be a list of subgroups',
    }).optional(),
    values: z.array(measurement, { message: 'values must be a list of measurements' }).optional(),
    defectives: z.array(count('defectives').nonnegative('defectives cannot be negative'), {
      message: 'defectives must be a list of counts',
    }).optional(),
    sizes: z.array(count('sizes').positive('each sample size must be at least 1'), {
      message: 'sizes must be a list of sample sizes',
    }).optional(),
    lsl: z.number({ message: 'lsl must be a finite number' }).optional(),
    usl: z.number({ message: 'usl must be a finite number' }).optional(),
    rules: spcRuleSetSchema.optional(),
    center: z.number({ message: 'center must be a finite number' }).optional(),
    sigma: z.number({ message: 'sigma must be a finite number' }).positive('sigma must be above 0').optional(),
  })
  .superRefine((v, ctx) => {
    const issue = (path: string, message: string) => ctx.addIssue({ code: 'custom', message, path: [path] });
    const label = CHART_LABEL[v.chart];
    const known = v.center !== undefined;
    const minCount = known ? 1 : 2;

    if (v.lsl !== undefined && v.usl !== undefined && !(v.lsl < v.usl)) issue('lsl', 'lsl must be below usl');

    // Fields that belong to another kind of chart are refused rather than ignored.
    const allowed = v.chart === 'p' ? ['defectives', 'sizes'] : v.chart === 'i-mr' ? ['values'] : ['subgroups'];
    for (const f of ['subgroups', 'values', 'defectives', 'sizes'] as const) {
      if (v[f] !== undefined && !allowed.includes(f)) issue(f, `${f} does not apply to ${label}`);
    }

    if (v.chart === 'xbar-r' || v.chart === 'xbar-s') {
      const groups = v.subgroups;
      if (groups === undefined) issue('subgroups', `subgroups are required for ${label}`);
      else if (groups.length < minCount) issue('subgroups', `${label} needs at least ${minCount} subgroups (got ${groups.length})`);
      else {
        const size = groups[0].length;
        const ragged = groups.findIndex((g) => g.length !== size);
        if (ragged >= 0) {
          issue('subgroups', `subgroup ${ragged + 1} has ${groups[ragged].length} measurements but subgroup 1 has ${size}; subgroups must be the same size`);
        } else if (size < 2) issue('subgroups', 'each subgroup needs at least 2 measurements');
        else if (v.chart === 'xbar-r' && size > 10) {
          issue('subgroups', `an X-bar/R chart takes subgroups of 2 to 10 (got ${size}); use xbar-s for larger subgroups`);
        }
      }
    }
    if (v.chart === 'i-mr') {
      if (v.values === undefined) issue('values', `values are required for ${label}`);
      else if (v.values.length < 2) issue('values', `an individuals chart needs at least 2 values (got ${v.values.length})`);
    }
    if (v.chart === 'p') {
      if (v.defectives === undefined) issue('defectives', 'defectives are required for a p chart');
      if (v.sizes === undefined) issue('sizes', 'sizes are required for a p chart');
      if (v.defectives && v.sizes) {
        if (v.defectives.length !== v.sizes.length) {
          issue('sizes', `defectives has ${v.defectives.length} entries but sizes has ${v.sizes.length}; give one of each per sample`);
        } else if (v.defectives.length < minCount) {
          issue('defectives', `a p chart needs at least ${minCount} samples (got ${v.defectives.length})`);
        } else {
          // Only where the size itself is valid; a bad size already has its own message.
          const sizes = v.sizes;
          const over = v.defectives.findIndex((d, i) => Number.isInteger(sizes[i]) && sizes[i] >= 1 && d > sizes[i]);
          if (over >= 0) issue('defectives', `sample ${over + 1}: ${v.defectives[over]} defectives is more than the sample size of ${v.sizes[over]}`);
        }
      }
      if (v.lsl !== undefined || v.usl !== undefined) {
        issue(v.usl !== undefined ? 'usl' : 'lsl', 'specification limits apply to measured values, not to a p chart');
      }
      if (v.sigma !== undefined) issue('sigma', 'sigma does not apply to a p chart; give center as the known fraction defective');
      if (v.center !== undefined && !(v.center >= 0 && v.center <= 1)) issue('center', 'for a p chart, center is a fraction defective between 0 and 1');
    } else if ((v.center === undefined) !== (v.sigma === undefined)) {
      issue(v.center === undefined ? 'center' : 'sigma', 'give both center and sigma to judge against known limits, or neither');
    }
  });

export type SpcAnalyzeInput = z.infer<typeof spcAnalyzeInputSchema>;
