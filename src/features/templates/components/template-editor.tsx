import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import type { TemplateProblem, TemplateRow } from '@shared/schemas/documents';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { SectionCard } from '@/components/ui/card';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Spinner } from '@/components/ui/spinner';
import { errorMessage, isApiError } from '@/lib/api';
import { useDebounced } from '@/lib/use-debounced';
import { useTemplatePreview } from '../api/preview-template';
import { useResetTemplate } from '../api/reset-template';
import { problemsOf } from '../api/template-problems';
import { useUpdateTemplate } from '../api/update-template';
import { DocumentPreview } from './document-preview';
import { ProblemList } from './problem-list';
import { SourceEditor, type SourceEditorHandle } from './source-editor';
import { templateTitle } from './template-labels';
import { VariablePicker } from './variable-picker';

interface TemplateEditorProps {
  template: TemplateRow;
  canEdit: boolean;
  /** The booking the preview is rendered with, and the control to choose it (from the bookings feature). */
  bookingId: string | null;
  bookingPicker: ReactNode;
}

const PREVIEW_DELAY_MS = 600;

export function TemplateEditor({ template, canEdit, bookingId, bookingPicker }: TemplateEditorProps) {
  const title = templateTitle(template.name);
  const [source, setSource] = useState(template.source);
  const [baseline, setBaseline] = useState(template.source);
  const [saveProblems, setSaveProblems] = useState<TemplateProblem[] | null>(null);
  const [fieldError, setFieldError] = useState<string | undefined>();
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [confirmReset, setConfirmReset] = useState(false);
  const editor = useRef<SourceEditorHandle>(null);
  const update = useUpdateTemplate();
  const reset = useResetTemplate();
  const dirty = source !== baseline;

  // A saved or reset template (from this page or a reload) becomes the new starting point.
  useEffect(() => {
    setSource(template.source);
    setBaseline(template.source);
  }, [template.source, template.updatedAt]);

  const change = (next: string) => {
    setSource(next);
    setSaved(null);
    setSaveProblems(null);
    setFieldError(undefined);
  };

  // The live preview: asked once typing settles, with the booking chosen beside it.
  const settled = useDebounced(source, PREVIEW_DELAY_MS);
  const preview = useTemplatePreview(bookingId && settled.trim() ? { name: template.name, source: settled, bookingId } : null);
  const previewProblems = problemsOf(preview.error);
  const [lastHtml, setLastHtml] = useState<string | null>(null);
  useEffect(() => {
    if (preview.data) setLastHtml(preview.data.html);
  }, [preview.data]);
  const html = preview.data?.html ?? lastHtml;
  const waiting = settled !== source || preview.isFetching;

  const problems = saveProblems ?? previewProblems ?? [];
  const problemLines = useMemo(() => new Set(problems.map((p) => p.line)), [problems]);
  const firstProblem = problems[0];
  const sourceError = fieldError ?? (firstProblem ? `Line ${firstProblem.line}: ${firstProblem.message.replace(/^line \d+(,? column \d+)?:\s*/i, '')}` : undefined);

  const save = (event: React.FormEvent) => {
    event.preventDefault();
    setSaved(null);
    setFormError(null);
    if (!source.trim()) {
      setFieldError('The template is empty.');
      setFormError('Check the template.');
      return;
    }
    update.mutate(
      { name: template.name, source },
      {
        onSuccess: () => setSaved('Template saved. Documents issued from now on use it; documents already issued keep their text.'),
        onError: (error) => {
          setFormError(isApiError(error, 'template_invalid') ? 'The template was not saved: fix the problems below.' : errorMessage(error));
          setSaveProblems(problemsOf(error));
          if (isApiError(error)) setFieldError(error.fields.source);
        },
      },
    );
  };

  const backToDefault = () =>
    reset.mutate(template.name, {
      onSuccess: () => {
        setConfirmReset(false);
        setSaveProblems(null);
        setFieldError(undefined);
        setSaved('Back to the shipped default.');
      },
    });

  return (
    <div className="grid items-start gap-6 lg:grid-cols-2">
      <div className="min-w-0 space-y-6">
        <SectionCard
          title="Source"
          description={
            template.name.startsWith('email-')
              ? 'Plain text with Handlebars: the first line is “Subject: …”; {{variable}} fills in a value. The PDF goes as an attachment.'
              : 'Handlebars over Markdown: {{variable}} fills in a value; {{#if variable}}…{{/if}} shows a part only when it has one.'
          }
          actions={template.isDefault && !dirty ? <Badge>Shipped default</Badge> : <Badge tone="caution">{dirty ? 'Unsaved changes' : 'Edited'}</Badge>}
        >
          <form onSubmit={save} noValidate aria-label={`${title} template`} className="space-y-4">
            <LiveRegion>{saved ? <Alert tone="success">{saved}</Alert> : null}</LiveRegion>
            <FormMessage message={formError} />
            {canEdit ? null : <p className="text-sm text-canvas-700">You can read this template; changing it is the owner’s.</p>}
            <SourceEditor
              ref={editor}
              name="source"
              label="Template source"
              value={source}
              onChange={change}
              readOnly={!canEdit}
              disabled={update.isPending || reset.isPending}
              error={sourceError}
              problemLines={problemLines}
            />
            <ProblemList problems={problems} onGoToLine={(line) => editor.current?.goToLine(line)} />
            {canEdit ? (
              <div className="flex flex-wrap items-center gap-2">
                <Button type="submit" isLoading={update.isPending} disabled={reset.isPending}>
                  {update.isPending ? 'Saving…' : 'Save template'}
                </Button>
                {dirty ? (
                  <Button variant="ghost" onClick={() => change(baseline)} disabled={update.isPending}>
                    Discard changes
                  </Button>
                ) : null}
                {template.isDefault ? null : (
                  <Button variant="secondary" onClick={() => setConfirmReset(true)} disabled={update.isPending}>
                    Back to the shipped default
                  </Button>
                )}
              </div>
            ) : null}
          </form>
        </SectionCard>

        <SectionCard title="Variables" description="Each one is filled from the booking, its customer and your company when a document is made.">
          <VariablePicker variables={template.variables} onInsert={canEdit ? (text) => editor.current?.insert(text) : undefined} />
        </SectionCard>
      </div>

      <SectionCard title="Preview" className="min-w-0 lg:sticky lg:top-4" description="Rendered with a real booking as you type; nothing is saved or sent.">
        <div className="space-y-3">
          {bookingPicker}
          <LiveRegion>
            {!bookingId ? (
              <p className="text-sm text-canvas-700">Choose a booking to see the preview.</p>
            ) : waiting ? (
              <Spinner className="text-sm text-canvas-700" label="Updating the preview…" />
            ) : previewProblems ? (
              <p className="text-sm font-semibold text-rust-700">The template has problems; the preview shows the last version that worked.</p>
            ) : null}
          </LiveRegion>
          {preview.isError && !previewProblems ? <Alert tone="danger">{errorMessage(preview.error)}</Alert> : null}
          {html ? <DocumentPreview html={html} label={`Preview of the ${title.toLowerCase()}`} /> : null}
        </div>
      </SectionCard>

      <ConfirmDialog
        open={confirmReset}
        title="Go back to the shipped default?"
        confirmLabel="Back to the shipped default"
        confirmVariant="danger"
        isLoading={reset.isPending}
        error={reset.isError ? errorMessage(reset.error) : null}
        onConfirm={backToDefault}
        onCancel={() => setConfirmReset(false)}
      >
        <p>Your company’s {title.toLowerCase()} template is replaced by the one Guyline ships. Documents already issued keep their text.</p>
      </ConfirmDialog>
    </div>
  );
}
