import { useState } from 'react';
import { Button } from '../../../components/ui/Button';
import { TextAreaField, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useSavePlanAsTemplate } from '../api/plan-templates';

/**
 * "Save as template" on a plan: its stages as they stand, counted in days from the plan's first day,
 * shared with the organization's clinicians. The server copies the stages, so nothing is lost.
 */
export function SaveAsTemplate({ orgId, planId }: { orgId: string; planId: string }) {
  const [open, setOpen] = useState(false);
  const [name, setName] = useState('');
  const [description, setDescription] = useState('');
  const save = useSavePlanAsTemplate(orgId);

  if (save.isSuccess && !open) {
    return (
      <Notice tone="done" role="status">
        <p>Saved as the template “{save.data.name}”. Every clinician of your organization can now start a plan from it.</p>
      </Notice>
    );
  }
  if (!open) {
    return (
      <Button variant="secondary" size="sm" onClick={() => setOpen(true)}>
        Save as template
      </Button>
    );
  }
  const fieldError = (f: string) =>
    save.error && 'fields' in save.error ? (save.error.fields as Record<string, string[]> | undefined)?.[f]?.[0] : undefined;
  return (
    <form
      aria-label="Save this plan as a template"
      className="space-y-2 rounded-md border border-rule p-3"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate({ planId, name: name.trim(), description }, { onSuccess: () => setOpen(false) });
      }}
    >
      <p className="text-sm text-ink-2">
        The stages, limits and guidance are kept as days from the plan&apos;s first day; no dates, names or notes about this athlete go into
        the template.
      </p>
      <TextField label="Template name" value={name} onChange={(e) => setName(e.target.value)} error={fieldError('name')} />
      <TextAreaField
        label="When it fits (optional)"
        hint="For other clinicians: who this plan suits and who it does not."
        rows={2}
        value={description}
        onChange={(e) => setDescription(e.target.value)}
        error={fieldError('description')}
      />
      {save.error && !fieldError('name') && !fieldError('description') && <ErrorNotice error={save.error} />}
      <div className="flex gap-2">
        <Button type="submit" size="sm" disabled={save.isPending || name.trim() === ''}>
          Save template
        </Button>
        <Button variant="secondary" size="sm" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
