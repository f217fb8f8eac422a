'use client';
import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { send, ApiClientError } from '@/components/ui/api';
import { buttonClass, dangerButtonClass } from '@/components/ui/buttons';
import { Field, inputClass } from '@/components/ui/fields';
import { Notice } from '@/components/ui/messages';

export function SettingsForm(props: { id: number; name: string; description: string; tags: string[]; visibility: string; canDelete: boolean }) {
  const router = useRouter();
  const [name, setName] = useState(props.name);
  const [description, setDescription] = useState(props.description);
  const [tags, setTags] = useState(props.tags.join(', '));
  const [visibility, setVisibility] = useState(props.visibility);
  const [msg, setMsg] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  return (
    <div className="max-w-2xl space-y-6">
      <form className="space-y-4" noValidate onSubmit={async (e) => {
        e.preventDefault();
        setFields({});
        try {
          await send('PATCH', `/api/projects/${props.id}`, { name, description, tags: tags.split(',').map((t) => t.trim()).filter(Boolean), visibility });
          setMsg({ tone: 'ok', text: 'Settings saved.' });
          router.refresh();
        } catch (err) {
          if (err instanceof ApiClientError) setFields(err.fields);
          setMsg({ tone: 'error', text: (err as Error).message });
        }
      }}>
        {msg && <Notice tone={msg.tone}>{msg.text}</Notice>}
        <Field label="Name" error={fields.name}><input value={name} onChange={(e) => setName(e.target.value)} className={inputClass} /></Field>
        <Field label="Description" error={fields.description}><textarea value={description} onChange={(e) => setDescription(e.target.value)} rows={4} className={inputClass} /></Field>
        <Field label="Tags" hint="Separate with commas" error={Object.entries(fields).find(([k]) => k.startsWith('tags'))?.[1]}><input value={tags} onChange={(e) => setTags(e.target.value)} className={inputClass} /></Field>
        <Field label="Who can see it">
          <select value={visibility} onChange={(e) => setVisibility(e.target.value)} className={inputClass}>
            <option value="private">Private: members only</option>
            <option value="unlisted">Unlisted: anyone with the link</option>
            <option value="public">Public: listed under Public models</option>
          </select>
        </Field>
        <button type="submit" className={buttonClass}>Save settings</button>
      </form>
      {props.canDelete && (
        <section className="space-y-2 rounded-lg border border-clay p-4">
          <h2 className="font-semibold text-clay">Delete this project</h2>
          <p className="text-sm text-ink-soft">Deletes every revision, export and dataset of the project. Forks stay, and record that their parent was deleted.</p>
          <button type="button" className={dangerButtonClass} onClick={async () => {
            if (!window.confirm(`Delete “${props.name}” for good?`)) return;
            try { await send('DELETE', `/api/projects/${props.id}`); router.push('/projects'); } catch (err) { setMsg({ tone: 'error', text: (err as Error).message }); }
          }}>Delete project</button>
        </section>
      )}
    </div>
  );
}
