import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Plan, PlanChange, PlanStatus, PlanSummary, UpdatePlanInput } from '@shared/schemas/master-data';
import { api } from '../../../lib/api-client';

export interface PlanListQuery {
  page?: number;
  pageSize?: number;
  sort?: string;
  partId?: string;
  status?: PlanStatus;
}

export const getPlans = (q: PlanListQuery) => api<{ items: PlanSummary[]; total: number }>('/plans', { query: { ...q } });
export const getPlansQueryOptions = (q: PlanListQuery) => queryOptions({ queryKey: ['plans', 'list', q], queryFn: () => getPlans(q), placeholderData: keepPreviousData });
export const usePlans = (q: PlanListQuery, enabled = true) => useQuery({ ...getPlansQueryOptions(q), enabled });

export const getPlan = (id: string) => api<Plan>(`/plans/${id}`);
export const getPlanQueryOptions = (id: string) => queryOptions({ queryKey: ['plans', 'one', id], queryFn: () => getPlan(id) });
export const usePlan = (id: string) => useQuery(getPlanQueryOptions(id));

export interface PlanRef { id: string; revision: number; status: string }
export interface PlanChanges { from: PlanRef | null; to: PlanRef; changes: PlanChange[] }
export const getPlanChanges = (id: string, against?: string) => api<PlanChanges>(`/plans/${id}/changes`, { query: { against } });
export const getPlanChangesQueryOptions = (id: string, against?: string) =>
  queryOptions({ queryKey: ['plans', 'changes', id, against ?? null], queryFn: () => getPlanChanges(id, against) });
export const usePlanChanges = (id: string, against?: string) => useQuery(getPlanChangesQueryOptions(id, against));

export interface PlanTemplateSummary { id: string; name: string; description: string }
export const getPlanTemplates = () => api<PlanTemplateSummary[]>('/plan-templates');
export const getPlanTemplatesQueryOptions = () => queryOptions({ queryKey: ['plan-templates'], queryFn: getPlanTemplates, staleTime: 10 * 60_000 });
export const usePlanTemplates = (enabled = true) => useQuery({ ...getPlanTemplatesQueryOptions(), enabled });

/** Every plan write changes the part's revision list and possibly its active plan. */
function useInvalidatePlans() {
  const qc = useQueryClient();
  return async (p: Plan) => {
    qc.setQueryData(getPlanQueryOptions(p.id).queryKey, p);
    await Promise.all([qc.invalidateQueries({ queryKey: ['plans'] }), qc.invalidateQueries({ queryKey: ['parts'] })]);
  };
}

export function useCreatePlanFromTemplate() {
  const done = useInvalidatePlans();
  return useMutation({
    mutationFn: (input: { partId: string; template: string }) => api<Plan>('/plans/from-template', { method: 'POST', body: input }),
    onSuccess: done,
  });
}

export function useUpdatePlan() {
  const done = useInvalidatePlans();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdatePlanInput & { id: string }) => api<Plan>(`/plans/${id}`, { method: 'PATCH', body: input }),
    onSuccess: done,
  });
}

export function useActivatePlan() {
  const done = useInvalidatePlans();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => api<Plan>(`/plans/${id}/activate`, { method: 'POST', body: { version } }),
    onSuccess: done,
  });
}

export function useRevisePlan() {
  const done = useInvalidatePlans();
  return useMutation({
    mutationFn: ({ id }: { id: string }) => api<Plan>(`/plans/${id}/revise`, { method: 'POST' }),
    onSuccess: done,
  });
}
