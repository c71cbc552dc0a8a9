import type { TemplateRow } from '@shared/schemas/documents';
import { Badge } from '@/components/ui/badge';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { TextLink } from '@/components/ui/text-link';
import { formatDateTime } from '@/lib/format';
import { TEMPLATE_LABELS } from './template-labels';

/** The company's templates, each with whether it is still the shipped default. */
export function TemplatesTable({ templates, hrefOf }: { templates: readonly TemplateRow[]; hrefOf: (name: string) => string }) {
  return (
    <Table caption="Document templates">
      <THead>
        <Tr>
          <Th>Template</Th>
          <Th>State</Th>
          <Th>Last changed</Th>
        </Tr>
      </THead>
      <TBody>
        {templates.map((t) => (
          <Tr key={t.name}>
            <Td className="min-w-64">
              <TextLink to={hrefOf(t.name)}>{TEMPLATE_LABELS[t.name]?.title ?? t.name}</TextLink>
              <p className="mt-0.5 text-canvas-600">{TEMPLATE_LABELS[t.name]?.description}</p>
            </Td>
            <Td>{t.isDefault ? <Badge>Shipped default</Badge> : <Badge tone="caution">Edited</Badge>}</Td>
            <Td className="whitespace-nowrap text-canvas-700">{t.isDefault || !t.updatedAt ? '—' : formatDateTime(t.updatedAt)}</Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
