import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TemplateRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';
import { templateQueryOptions } from './get-template';
import { templatesQueryOptions } from './get-templates';

/** Validates and saves the company's copy; a bad template is a 400 `template_invalid` and nothing is saved. */
export const updateTemplate = ({ name, source }: { name: string; source: string }) =>
  api.put<TemplateRow>(`/api/templates/${encodeURIComponent(name)}`, { source });

export function useUpdateTemplate() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateTemplate,
    onSuccess: (template) => {
      queryClient.setQueryData(templateQueryOptions(template.name).queryKey, template);
      void queryClient.invalidateQueries({ queryKey: templatesQueryOptions().queryKey });
    },
  });
}
