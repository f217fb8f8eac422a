'use client';
import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { send, ApiClientError } from '@/components/ui/api';
import { buttonClass } from '@/components/ui/buttons';
import { Field, inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';
import type { Starter } from '@/lib/models/starters';

const formSchema = z.object({
  name: z.string().trim().min(1, 'enter a name').max(120, 'at most 120 characters'),
  description: z.string().max(5000, 'at most 5000 characters'),
  tags: z.string().max(400),
  visibility: z.enum(['private', 'unlisted', 'public']),
  starter: z.string().min(1, 'choose a starting model'),
});
type FormValues = z.infer<typeof formSchema>;

export function NewProjectForm({ starters }: { starters: Starter[] }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, setError: setFieldError, formState } = useForm<FormValues>({
    resolver: zodResolver(formSchema),
    defaultValues: { name: '', description: '', tags: '', visibility: 'private', starter: starters[0]?.id ?? '' },
  });
  const onSubmit = handleSubmit(async (v) => {
    setError(null);
    try {
      const tags = v.tags.split(',').map((t) => t.trim()).filter(Boolean);
      const p = await send<{ id: number }>('POST', '/api/projects', { name: v.name, description: v.description, tags, visibility: v.visibility, starter: v.starter });
      router.push(`/projects/${p.id}`);
    } catch (e) {
      if (e instanceof ApiClientError) {
        for (const [k, m] of Object.entries(e.fields)) if (k in formSchema.shape) setFieldError(k as keyof FormValues, { message: m });
        setError(e.message);
      } else setError('The server could not be reached.');
    }
  });
  const errors = formState.errors;
  return (
    <form onSubmit={onSubmit} className="space-y-5" noValidate>
      {error && <Notice tone="error">{error}</Notice>}
      <fieldset className="space-y-2">
        <legend className="text-sm font-medium">Start from</legend>
        <div className="grid gap-2 sm:grid-cols-2">
          {starters.map((s) => (
            <label key={s.id} className="flex cursor-pointer gap-2 rounded-lg border border-rule bg-card p-3 has-[:checked]:border-tide has-[:checked]:bg-tide-pale">
              <input type="radio" value={s.id} {...register('starter')} className="mt-1" />
              <span>
                <span className="block font-medium">{s.title}</span>
                <span className="block text-xs text-ink-soft">{s.description}</span>
              </span>
            </label>
          ))}
        </div>
        {errors.starter && <p className="text-xs text-clay">{errors.starter.message}</p>}
      </fieldset>
      <Field label="Name" error={errors.name?.message}>
        <input {...register('name')} className={inputClass} />
      </Field>
      <Field label="Description" error={errors.description?.message}>
        <textarea {...register('description')} rows={3} className={inputClass} />
      </Field>
      <Field label="Tags" hint="Separate with commas, e.g. 2D, teaching" error={errors.tags?.message}>
        <input {...register('tags')} className={inputClass} />
      </Field>
      <Field label="Who can see it">
        <select {...register('visibility')} className={inputClass}>
          <option value="private">Private: members only</option>
          <option value="unlisted">Unlisted: anyone with the link</option>
          <option value="public">Public: listed under Public models</option>
        </select>
      </Field>
      <button type="submit" disabled={formState.isSubmitting} className={buttonClass}>
        {formState.isSubmitting ? 'Creating…' : 'Create project'}
      </button>
    </form>
  );
}
