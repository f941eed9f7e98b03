import type { ReactNode } from 'react';
import { formatLatitude, formatLongitude, formatUtc } from '../../../lib/format';
import type { CastDetail } from '../types';

function Row({ term, children, warn = false }: { term: string; children: ReactNode; warn?: boolean }) {
  return (
    <div className="grid grid-cols-[8.5rem_1fr] gap-2 border-b border-paper-rule/60 px-4 py-1 last:border-0">
      <dt className="text-xs text-ink-muted">{term}</dt>
      <dd className={`text-sm ${warn ? 'text-warn-strong' : 'text-ink-strong'}`}>{children}</dd>
    </div>
  );
}

const mono = (v: ReactNode) => <span className="font-mono text-[0.8rem] tabular-nums">{v}</span>;

/** Where and when the cast was, where it came from, and the choices the processing made. */
export function CastMeta({ cast }: { cast: CastDetail }) {
  const m = cast.metadata;
  const mld = m.mixedLayer;
  const fallback = m.saar != null && /fallback/i.test(m.saar);
  return (
    <dl aria-label="Cast metadata">
      <Row term="Station · cast">{mono(`${cast.station} · ${cast.cast}`)}</Row>
      <Row term="Position">
        {mono(
          cast.latitude == null || cast.longitude == null
            ? '—'
            : `${formatLatitude(cast.latitude)}  ${formatLongitude(cast.longitude)}`,
        )}
      </Row>
      <Row term="Time (UTC)">{mono(formatUtc(cast.time))}</Row>
      <Row term="Bottom depth">{mono(cast.bottomDepth == null ? '—' : `${cast.bottomDepth.toFixed(0)} m`)}</Row>
      <Row term="Levels">
        {mono(cast.levels)}
        {m.profile && (
          <span className="ml-2 text-xs text-ink-muted">
            {m.profile.hasUpcast ? 'downcast kept, upcast set aside' : 'downcast only'}
            {m.profile.reversals ? ` · ${m.profile.reversals} pressure reversals` : ''}
          </span>
        )}
      </Row>
      <Row term="Source file">
        <span className="break-all font-mono text-[0.8rem]">{cast.sourceFile ?? '—'}</span>
        {m.format && <span className="ml-2 text-xs text-ink-muted">({m.format})</span>}
      </Row>
      <Row term="Absolute salinity" warn={fallback}>
        {m.saar ?? '—'}
      </Row>
      <Row term="Mixed layer">
        {mld?.p_mld != null ? mono(`${mld.p_mld.toFixed(1)} dbar`) : <span className="text-ink-muted">not found</span>}
        {(mld?.reason || mld?.status) && (
          <span className="ml-2 text-xs text-ink-muted">{mld.reason ?? mld.status}</span>
        )}
      </Row>
    </dl>
  );
}
