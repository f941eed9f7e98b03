import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { formatUtc } from '../../../lib/format';
import { useDeleteView, useSaveView, useSavedViews } from '../api';

/** The analyst's saved section views: the current URL query under a name, to open again later. */
export function SavedViews({ cruiseId, query, canSave }: { cruiseId: string; query: string; canSave: boolean }) {
  const views = useSavedViews(cruiseId);
  const save = useSaveView(cruiseId);
  const remove = useDeleteView(cruiseId);
  const [name, setName] = useState('');
  const [problem, setProblem] = useState<string | null>(null);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const trimmed = name.trim();
    if (!trimmed) {
      setProblem('Name the view.');
      return;
    }
    setProblem(null);
    save.mutate({ name: trimmed, query }, { onSuccess: () => setName('') });
  };

  return (
    <section aria-labelledby="saved-views" className="border border-paper-rule bg-paper-raised">
      <h3
        id="saved-views"
        className="border-b border-paper-rule px-3 py-1.5 text-xs font-semibold uppercase tracking-[0.12em] text-ink-soft"
      >
        Saved views
      </h3>
      {canSave && (
        <form onSubmit={submit} className="flex items-start gap-1.5 border-b border-paper-rule px-3 py-2">
          <div className="flex flex-1 flex-col">
            <input
              aria-label="Name of the view to save"
              placeholder="Name this view"
              value={name}
              maxLength={100}
              onChange={(e) => setName(e.target.value)}
              aria-invalid={problem ? true : undefined}
              className="h-7 w-full rounded border border-paper-rule bg-paper px-2 text-sm"
            />
            {problem && <p className="text-xs text-warn-strong">{problem}</p>}
          </div>
          <Button type="submit" size="sm" busy={save.isPending}>
            Save
          </Button>
        </form>
      )}
      {save.isError && (
        <div className="px-3 py-2">
          <ErrorNotice error={save.error} title="The view was not saved" />
        </div>
      )}
      {remove.isError && (
        <div className="px-3 py-2">
          <ErrorNotice error={remove.error} title="The view was not deleted" />
        </div>
      )}
      {views.isPending && <p className="px-3 py-2 text-xs text-ink-muted">Loading the saved views…</p>}
      {views.isError && (
        <div className="px-3 py-2">
          <ErrorNotice error={views.error} title="The saved views could not be loaded" />
        </div>
      )}
      {views.isSuccess && views.data.length === 0 && (
        <p className="px-3 py-2 text-xs text-ink-muted">
          {canSave ? 'None yet. A saved view keeps every control and the station cursor.' : 'No saved views.'}
        </p>
      )}
      {views.isSuccess && views.data.length > 0 && (
        <ul className="max-h-48 overflow-y-auto text-sm">
          {views.data.map((v) => (
            <li key={v.id} className="flex items-center gap-2 border-b border-paper-rule/60 px-3 py-1 last:border-b-0">
              <Link
                to={{ search: v.query ? `?${v.query.replace(/^\?/, '')}` : '' }}
                className="min-w-0 flex-1 truncate"
                aria-label={`Open the view ${v.name}`}
              >
                {v.name}
              </Link>
              {v.createdAt && (
                <span className="font-mono text-2xs text-ink-muted">{formatUtc(v.createdAt).slice(0, 10)}</span>
              )}
              {canSave && (
                <Button
                  size="sm"
                  variant="quiet"
                  aria-label={`Delete the view ${v.name}`}
                  busy={remove.isPending && remove.variables === v.id}
                  onClick={() => remove.mutate(v.id)}
                >
                  ×
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
