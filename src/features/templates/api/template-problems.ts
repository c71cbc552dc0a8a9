import type { TemplateProblem } from '@shared/schemas/documents';
import { isApiError } from '@/lib/api';

/**
 * A 400 `template_invalid` (on saving or previewing a template or a clause) carries `problems`
 * beside `error`, each with its line. Null for any other error.
 */
export function problemsOf(error: unknown): TemplateProblem[] | null {
  if (!isApiError(error, 'template_invalid')) return null;
  const problems = (error.body as { problems?: TemplateProblem[] } | null)?.problems;
  return Array.isArray(problems) ? problems : [];
}
