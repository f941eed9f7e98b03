import { Link } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { useRemoveUpload, useReplaceDecision, useRetryUpload, useUpload } from '../api';
import { isActive, needsAnswers, type Upload } from '../types';
import { Bar, StatusBadge } from './Bars';
import { ColumnMappingStep } from './ColumnMappingStep';
import { FileProblems } from './FileProblems';

/**
 * What happens to an upload after its bytes arrived: queued, processing (with the job's progress),
 * then ready with its casts, or failed with its errors by file, line and column, the mapping step
 * when headers were not recognised, and a retry.
 */
export function UploadFollow({
  cruiseId,
  upload: initial,
  canUpload,
}: {
  cruiseId: string;
  upload: Upload;
  canUpload: boolean;
}) {
  const query = useUpload(cruiseId, initial.id, initial);
  const retry = useRetryUpload(cruiseId);
  const decide = useReplaceDecision(cruiseId);
  const remove = useRemoveUpload(cruiseId);
  const upload = query.data ?? initial;
  const active = isActive(upload.status);
  const needsMapping = upload.status === 'failed' && (upload.unmappedHeaders?.length ?? 0) > 0;
  const waitsForAnswers = needsAnswers(upload);

  return (
    <div className="flex flex-col gap-2">
      <div className="grid grid-cols-[6.5rem_1fr_auto] items-center gap-3">
        <StatusBadge status={upload.status} />
        {active ? (
          <Bar
            label={`Processing ${upload.filename}`}
            value={upload.status === 'queued' ? 0 : upload.progress}
            figures={upload.status === 'queued' ? 'waiting for a worker' : `${Math.round(upload.progress * 100)} %`}
          />
        ) : upload.status === 'ready' ? (
          <p className="text-sm text-ink-soft">
            {upload.castIds.length === 1 ? '1 cast' : `${upload.castIds.length} casts`} stored
            {upload.duplicate && (
              <span className="ml-2 text-ink-muted">(the same bytes were uploaded before; no new casts)</span>
            )}
            {upload.castIds.length > 0 && (
              <>
                {' · '}
                <Link to={`/cruises/${encodeURIComponent(cruiseId)}/casts/${encodeURIComponent(upload.castIds[0])}`}>
                  open the first
                </Link>
              </>
            )}
          </p>
        ) : upload.status === 'awaiting_decision' ? (
          <p className="text-sm text-ink-strong">
            {upload.conflicts?.items.length === 1
              ? 'This file has a cast that already exists.'
              : `This file has ${upload.conflicts?.items.length ?? 0} casts that already exist.`}
          </p>
        ) : (
          <p className="text-sm text-warn-strong">
            {needsMapping
              ? 'Some headers were not recognised.'
              : waitsForAnswers
                ? 'The file does not say everything a cast needs; answer above, once for the batch.'
                : 'The file could not be read.'}
          </p>
        )}
        {upload.status === 'failed' && canUpload && !needsMapping && !waitsForAnswers && (
          <Button
            size="sm"
            variant="secondary"
            busy={retry.isPending}
            onClick={() => retry.mutate(upload.id)}
            aria-label={`Retry ${upload.filename}`}
          >
            Process again
          </Button>
        )}
      </div>
      {(upload.status === 'failed' || upload.status === 'awaiting_decision') &&
        canUpload &&
        upload.castIds.length === 0 && (
          <div>
            <Button
              size="sm"
              variant="quiet"
              busy={remove.isPending}
              onClick={() => remove.mutate(upload.id)}
              aria-label={`Remove the upload ${upload.filename}`}
            >
              Remove this upload
            </Button>
          </div>
        )}
      {upload.status === 'awaiting_decision' && upload.conflicts && (
        <div
          className="rounded border border-ink/30 bg-ink-wash/40 p-3 text-sm"
          role="group"
          aria-label={`Replace earlier casts with ${upload.filename}?`}
        >
          <p className="text-ink-strong">
            Replace the earlier versions with this file? The earlier versions stay in each cast&apos;s history, and
            flags set on them are carried over where the levels match.
          </p>
          <ul className="my-2 list-disc pl-5 font-mono text-xs text-ink-soft">
            {upload.conflicts.items.map((c) => (
              <li key={`${c.station}/${c.cast}`}>
                station {c.station} cast {c.cast}: now from {c.existingFile}, new in {c.file}
              </li>
            ))}
          </ul>
          {canUpload && (
            <div className="flex gap-2">
              <Button
                size="sm"
                variant="primary"
                busy={decide.isPending}
                onClick={() => decide.mutate({ uploadId: upload.id, replace: true })}
              >
                Replace the earlier versions
              </Button>
              <Button
                size="sm"
                variant="secondary"
                disabled={decide.isPending}
                onClick={() => decide.mutate({ uploadId: upload.id, replace: false })}
              >
                Keep the earlier versions
              </Button>
            </div>
          )}
          {decide.isError && <ErrorNotice error={decide.error} title="The answer was not taken" />}
        </div>
      )}
      {remove.isError && <ErrorNotice error={remove.error} title="The upload was not removed" />}
      {query.isError && <ErrorNotice error={query.error} title="The status could not be read" />}
      {retry.isError && <ErrorNotice error={retry.error} title="The file was not queued again" />}
      <FileProblems problems={upload.errors} kind="error" filename={upload.filename} />
      {upload.status !== 'failed' && (
        <FileProblems problems={upload.warnings} kind="warning" filename={upload.filename} limit={8} />
      )}
      {needsMapping && canUpload && (
        <ColumnMappingStep
          cruiseId={cruiseId}
          uploadId={upload.id}
          filename={upload.filename}
          headers={upload.unmappedHeaders ?? []}
        />
      )}
    </div>
  );
}
