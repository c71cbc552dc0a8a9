import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TemplateRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';
import { templateQueryOptions } from './get-template';
import { templatesQueryOptions } from './get-templates';

/** Drops the company's copy: the template is the shipped default again. */
export const resetTemplate = (name: string) => api.delete<TemplateRow>(`/api/templates/${encodeURIComponent(name)}`);

export function useResetTemplate() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resetTemplate,
    onSuccess: (template) => {
      queryClient.setQueryData(templateQueryOptions(template.name).queryKey, template);
      void queryClient.invalidateQueries({ queryKey: templatesQueryOptions().queryKey });
    },
  });
}
