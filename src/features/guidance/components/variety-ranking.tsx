import { useState } from 'react';
import { LABELS } from '@shared/domain/codes';
import type { NearResponse, PollinationChecks, VarietyEvidence } from '@shared/schemas/atlas';
import { IntervalBar, percent } from './interval-bar';
import { RipeDatesChart } from './ripe-dates-chart';

const VERDICT_STYLE: Record<VarietyEvidence['seasonFit']['verdict'], string> = {
  likely: 'bg-leaf-100 text-leaf-700',
  marginal: 'bg-amber-soft/60 text-ink',
  unlikely: 'bg-fig-100 text-fig-700',
  unknown: 'bg-paper text-ink/70 ring-1 ring-fig-100',
};

/** This variety's pollination check here (the answer gives one per fig type). */
function pollinationOf(v: VarietyEvidence, near: NearResponse): PollinationChecks {
  return near.pollinationByFigType[v.figType]!;
}

/** Whether this variety's crops need the wasp where it is absent (shown, but marked). */
export function waspBlocked(v: VarietyEvidence, pollination: PollinationChecks): boolean {
  return pollination.main.fruitExpected === 'no' && (v.byCrop.breba.trees === 0 || pollination.breba.fruitExpected === 'no');
}

const round = (v: number | null) => (v === null ? '—' : String(Math.round(v)));

/** The ranked varieties with the evidence behind each rank. */
export function VarietyRanking({ near, onlyIds }: { near: NearResponse; onlyIds?: Set<number> | null }) {
  const list = onlyIds ? near.varieties.filter((v) => onlyIds.has(v.varietyId)) : near.varieties;
  if (near.varieties.length === 0)
    return <p className="rounded-lg border border-fig-100 bg-white p-4 text-ink/80">No reports of any variety within {near.radiusKm} km yet. Try a larger radius.</p>;
  if (list.length === 0) return <p className="rounded-lg border border-fig-100 bg-white p-4 text-ink/80">None of the varieties reported here passes this filter.</p>;
  return (
    <ol className="flex flex-col gap-3" aria-label="Varieties ranked for this place">
      {list.map((v) => (
        <VarietyRow key={v.varietyId} v={v} near={near} />
      ))}
    </ol>
  );
}

function VarietyRow({ v, near }: { v: VarietyEvidence; near: NearResponse }) {
  const [showDates, setShowDates] = useState(false);
  const pollination = pollinationOf(v, near);
  const blocked = waspBlocked(v, pollination);
  const fit = v.seasonFit;
  const ci = v.all.interval90;
  return (
    <li className={`rounded-lg border bg-white p-4 ${blocked ? 'border-dashed border-fig-300' : 'border-fig-100'}`} data-testid="variety-row">
      <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
        <span className="text-sm font-semibold text-ink/70">#{v.rank}</span>
        <h3 className="text-lg font-semibold text-fig-900">{v.name}</h3>
        {v.isFictional && <span className="rounded bg-fig-50 px-1.5 text-xs text-fig-700">fictional (demo)</span>}
        <span className="text-sm text-ink/70">{LABELS.figType[v.figType]}</span>
        {v.ripeningClass && <span className="text-sm text-ink/70">· {LABELS.ripeningClass[v.ripeningClass]}</span>}
        <span className={`ml-auto rounded-full px-2 py-0.5 text-xs font-medium ${VERDICT_STYLE[fit.verdict]}`}>{LABELS.verdict[fit.verdict]}</span>
      </div>
      <p className="mt-1 text-sm text-ink/90">{v.reason}</p>
      {blocked && (
        <p className="mt-2 rounded-md bg-fig-50 px-3 py-2 text-sm text-fig-700" data-testid="wasp-warning">
          <strong className="font-medium">Needs the fig wasp, which is not recorded here.</strong> {pollination.main.explanation}
        </p>
      )}
      <dl className="mt-3 grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
        <div>
          <dt className="text-ink/70">Evidence within {near.radiusKm} km</dt>
          <dd>
            {v.all.reports} report{v.all.reports === 1 ? '' : 's'} · {v.all.trees} tree{v.all.trees === 1 ? '' : 's'} · {v.growers} grower{v.growers === 1 ? '' : 's'}
          </dd>
        </div>
        <div>
          <dt className="text-ink/70">Share of trees that ripened (90 % interval)</dt>
          <dd className="flex items-center gap-2">
            <IntervalBar
              share={v.all.share}
              low={ci?.low ?? null}
              high={ci?.high ?? null}
              adjusted={v.adjustedShare}
              label={`Ripened ${percent(v.all.share)}, 90 % interval ${percent(ci?.low)} to ${percent(ci?.high)}, adjusted ${percent(v.adjustedShare)}`}
            />
            <span>
              {percent(v.all.share)} {ci ? `(${percent(ci.low)}–${percent(ci.high)})` : ''} · adjusted {percent(v.adjustedShare)}
            </span>
          </dd>
        </div>
        <div>
          <dt className="text-ink/70">Season fit ({LABELS.growingForm[fit.form].toLowerCase()})</dt>
          <dd>
            {round(fit.localSeasonDays)} days here vs {round(fit.neededDays)} needed
            {fit.neededFrom === 'catalogue' ? ' (catalogue class)' : fit.neededFrom === 'reports' ? ' (reports elsewhere)' : ''}
            {fit.headStartDays ? `, head start ${fit.headStartDays} days` : ''}
            {fit.marginDays !== null ? `, margin ${fit.marginDays > 0 ? '+' : ''}${Math.round(fit.marginDays)} days` : ''}
            <span className="block text-xs text-ink/70">{fit.explanation}</span>
          </dd>
        </div>
        <div>
          <dt className="text-ink/70">Pollination check</dt>
          <dd>
            Main crop: {expected(pollination.main.fruitExpected)}
            {v.byCrop.breba.trees > 0 && <> · Breba: {expected(pollination.breba.fruitExpected)}</>}
            {!blocked && <span className="block text-xs text-ink/70">{pollination.main.explanation}</span>}
          </dd>
        </div>
      </dl>
      {/* Outside the list of terms: a <dl> may hold only term and description groups (axe: definition-list). */}
      {v.medianFirstRipeDoy !== null && (
        <div className="mt-2">
          <button type="button" className="text-sm font-medium text-fig-600 underline" aria-expanded={showDates} onClick={() => setShowDates((s) => !s)}>
            {showDates ? 'Hide' : 'Show'} first-ripe dates nearby
          </button>
          {showDates && <RipeDatesChart varietyId={v.varietyId} lat={near.point.lat} lon={near.point.lon} radiusKm={near.radiusKm} />}
        </div>
      )}
    </li>
  );
}

const expected = (e: 'yes' | 'no' | 'uncertain') => (e === 'yes' ? 'fruit expected' : e === 'no' ? 'no fruit without the wasp' : 'uncertain');
