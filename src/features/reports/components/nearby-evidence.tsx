import { useQuery } from '@tanstack/react-query';
import { LABELS } from '@shared/domain/codes';
import type { Report } from '@shared/schemas/reports';
import { MethodNote } from '../../../components/method-note';
import { reportQueries } from '../api';

const VERDICT_CLASS = {
  likely: 'bg-leaf-100 text-leaf-700',
  marginal: 'bg-amber-soft/60 text-ink',
  unlikely: 'bg-fig-100 text-fig-700',
  unknown: 'bg-paper text-ink/70',
} as const;

/** What the regional engine says about this variety around the report's grid cell. */
export function NearbyEvidence({ report }: { report: Report }) {
  const varietyId = report.variety?.status === 'accepted' ? report.variety.id : null;
  const fit = useQuery({ ...reportQueries.fit(varietyId ?? 0, report.gridLat, report.gridLon, report.form), enabled: varietyId !== null });
  if (varietyId === null) return <p className="text-sm text-ink/70">Nearby evidence appears once editors have accepted this variety name.</p>;
  if (fit.isLoading) return <p className="text-sm text-ink/70">Gathering nearby evidence…</p>;
  if (!fit.data) return <p className="text-sm text-ink/70">Nearby evidence is not available right now.</p>;
  const { seasonFit, season } = fit.data;
  return (
    <div className="flex flex-col gap-2 text-sm">
      <p>
        <span className={`rounded px-2 py-0.5 font-medium ${VERDICT_CLASS[seasonFit.verdict]}`}>{LABELS.verdict[seasonFit.verdict]}</span>{' '}
        <span className="text-ink/80">· {LABELS.growingForm[seasonFit.form]} · around this 5 km cell</span>
      </p>
      <p className="text-ink/80">{seasonFit.explanation}</p>
      {season.days50 !== null && (
        <MethodNote method={season.method}>
          Frost-free season here: about {Math.round(season.days50)} days in a typical year (half the years are longer).
        </MethodNote>
      )}
    </div>
  );
}
