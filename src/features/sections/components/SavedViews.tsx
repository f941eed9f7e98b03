import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { formatUtc } from '../../../lib/format';
import { useDeleteView, useEditView, useSaveView, useSavedViews } from '../api';
import type { SavedView } from '../types';

/**
 * Saved section views: the current URL query under a name. Yours you may share with the cruise team,
 * point at the current view, or delete; the team's shared views name whose they are and are read-only
 * (open one, or copy it into your own). The server enforces the same.
 */
export function SavedViews({ cruiseId, query, canSave }: { cruiseId: string; query: string; canSave: boolean }) {
  const views = useSavedViews(cruiseId);
  const save = useSaveView(cruiseId);
  const edit = useEditView(cruiseId);
  const remove = useDeleteView(cruiseId);
  const [name, setName] = useState('');
  const [share, setShare] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const trimmed = name.trim();
    if (!trimmed) {
      setProblem('Name the view.');
      return;
    }
    setProblem(null);
    save.mutate({ name: trimmed, query, ...(share ? { shared: true } : {}) }, { onSuccess: () => setName('') });
  };
  const mine = views.data?.filter((v) => v.mine) ?? [];
  const team = views.data?.filter((v) => !v.mine) ?? [];
  const failed = save.error ?? edit.error ?? remove.error;

  const row = (v: SavedView) => (
    <li key={v.id} className="flex items-center gap-1.5 border-b border-paper-rule/60 px-3 py-1 last:border-b-0">
      <div className="min-w-0 flex-1">
        <Link
          to={{ search: v.query ? `?${v.query.replace(/^\?/, '')}` : '' }}
          className="block truncate"
          aria-label={`Open the view ${v.name}`}
        >
          {v.name}
        </Link>
        <span className="block truncate text-2xs text-ink-muted">
          {v.mine ? (v.shared ? 'yours, shared with the team' : 'yours, not shared') : `by ${v.owner.name}, read-only`}
          {' · '}
          <span className="font-mono">{formatUtc(v.updatedAt).slice(0, 10)}</span>
        </span>
      </div>
      {v.mine ? (
        <>
          <Button
            size="sm"
            variant="quiet"
            aria-label={v.shared ? `Stop sharing the view ${v.name}` : `Share the view ${v.name} with the team`}
            busy={edit.isPending && edit.variables?.id === v.id && edit.variables.shared !== undefined}
            onClick={() => edit.mutate({ id: v.id, shared: !v.shared })}
          >
            {v.shared ? 'Unshare' : 'Share'}
          </Button>
          <Button
            size="sm"
            variant="quiet"
            aria-label={`Point the view ${v.name} at the current view`}
            title="Keep this name for what is on screen now"
            busy={edit.isPending && edit.variables?.id === v.id && edit.variables.query !== undefined}
            onClick={() => edit.mutate({ id: v.id, query })}
          >
            Update
          </Button>
          <Button
            size="sm"
            variant="quiet"
            aria-label={`Delete the view ${v.name}`}
            busy={remove.isPending && remove.variables === v.id}
            onClick={() => remove.mutate(v.id)}
          >
            ×
          </Button>
        </>
      ) : (
        canSave && (
          <Button
            size="sm"
            variant="quiet"
            aria-label={`Copy the view ${v.name} into your own`}
            busy={save.isPending && save.variables?.query === v.query}
            onClick={() => save.mutate({ name: `${v.name} (copy)`.slice(0, 100), query: v.query })}
          >
            Copy
          </Button>
        )
      )}
    </li>
  );

  return (
    <section aria-labelledby="saved-views" className="border border-paper-rule bg-paper-raised">
      <h3
        id="saved-views"
        className="border-b border-paper-rule px-3 py-1.5 text-xs font-semibold uppercase tracking-[0.12em] text-ink-soft"
      >
        Saved views
      </h3>
      {canSave && (
        <form onSubmit={submit} className="flex flex-col gap-1 border-b border-paper-rule px-3 py-2">
          <div className="flex items-start gap-1.5">
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
          </div>
          <label className="flex items-center gap-1.5 text-xs text-ink-soft">
            <input type="checkbox" checked={share} onChange={(e) => setShare(e.target.checked)} />
            Share with the cruise team (they read it; you alone edit it)
          </label>
        </form>
      )}
      {failed && (
        <div className="px-3 py-2">
          <ErrorNotice error={failed} title="The saved views were not changed" />
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
      {mine.length > 0 && (
        <ul aria-label="Your saved views" className="max-h-48 overflow-y-auto text-sm">
          {mine.map(row)}
        </ul>
      )}
      {team.length > 0 && (
        <>
          <h4 className="border-y border-paper-rule px-3 py-1 text-2xs font-semibold uppercase tracking-[0.1em] text-ink-muted">
            Shared by the team
          </h4>
          <ul aria-label="Views shared by the team" className="max-h-48 overflow-y-auto text-sm">
            {team.map(row)}
          </ul>
        </>
      )}
    </section>
  );
}
