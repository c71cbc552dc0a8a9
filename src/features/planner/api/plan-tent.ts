import { useMutation } from '@tanstack/react-query';
import type { PlannerRequest, PlannerResult } from '@shared/schemas/planner';
import { api } from '@/lib/api';

/** POST /api/planner: the server plans with the company's own stock and rules. */
export const planTent = (body: PlannerRequest) => api.post<PlannerResult>('/api/planner', body);

/** A question asked on demand (the Plan button), so a mutation rather than a cached query. */
export const usePlanTent = () => useMutation({ mutationFn: planTent });
