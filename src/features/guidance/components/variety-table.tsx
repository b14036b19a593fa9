import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { Fragment, useMemo, useState } from 'react';
import { LABELS, type FigType } from '@shared/domain/codes';
import { plural } from '@shared/domain/units';
import type { NearResponse, PollinationChecks, VarietyEvidence } from '@shared/schemas/atlas';
import { SortableTableHead } from '../../../components/sortable-table-head';
import { VarietyLink } from '../../varieties/components/variety-link';
import { useUnits } from '../../units/use-units';
import { IntervalBar, percent } from './interval-bar';
import { RipeDatesChart } from './ripe-dates-chart';

/** Whether this variety's crops need the wasp where it is absent (shown, but marked). */
export function waspBlocked(v: VarietyEvidence, pollination: PollinationChecks): boolean {
  return pollination.main.fruitExpected === 'no' && (v.byCrop.breba.trees === 0 || pollination.breba.fruitExpected === 'no');
}

/** A number resting on this few trees is drawn as a hint, not a finding. */
export const THIN_TREES = 2;

export interface ChanceView {
  value: number | null;
  low: number | null;
  high: number | null;
  trees: number;
  /** The model says the evidence is too thin for a verdict. */
  tooLittle: boolean;
  thin: boolean;
  from: 'model' | 'share';
}

/**
 * The chance to show: the calibrated model's (issue 16) when the answer carries it, else the
 * distance-weighted share adjusted toward the variety's overall rate, with the 90 % interval of
 * the local share.
 */
export function chanceOf(v: VarietyEvidence): ChanceView {
  if (v.chance) {
    const c = v.chance;
    return { value: c.probability, low: c.low, high: c.high, trees: c.trees, tooLittle: !c.enoughEvidence, thin: c.trees <= THIN_TREES, from: 'model' };
  }
  const ci = v.all.interval90;
  const trees = Math.round(v.all.trees);
  return { value: v.adjustedShare, low: ci?.low ?? null, high: ci?.high ?? null, trees, tooLittle: v.adjustedShare === null, thin: trees <= THIN_TREES, from: 'share' };
}

const VERDICT_STYLE: Record<VarietyEvidence['seasonFit']['verdict'], string> = {
  likely: 'bg-leaf-100 text-leaf-700',
  marginal: 'bg-amber-soft/60 text-ink',
  unlikely: 'bg-fig-100 text-fig-700',
  unknown: 'bg-paper text-ink/70 ring-1 ring-fig-100',
};

/** The fig type in one word for the table (the full label, with what it means, is in the pollination notes). */
const FIG_TYPE_SHORT: Record<FigType, string> = { common: 'Common', 'san-pedro': 'San Pedro', smyrna: 'Smyrna', caprifig: 'Caprifig', unknown: 'Unknown' };

const cropsOf = (v: VarietyEvidence) => [v.byCrop.breba.trees > 0 ? 'breba' : null, v.byCrop.main.trees > 0 ? 'main' : null].filter(Boolean).join(' + ') || '—';

export function ChanceCell({ v, barClassName = 'w-12 sm:w-20' }: { v: VarietyEvidence; barClassName?: string }) {
  const c = chanceOf(v);
  if (c.tooLittle)
    return (
      <span className="text-sm text-ink/70" data-testid="chance-too-little">
        too little evidence ({plural(c.trees, 'tree')})
      </span>
    );
  const label = `Chance ${percent(c.value)}, likely between ${percent(c.low)} and ${percent(c.high)}, from ${plural(c.trees, 'tree')}`;
  return (
    <div className={`flex items-center gap-2 ${c.thin ? 'opacity-60' : ''}`} data-testid={c.thin ? 'chance-thin' : 'chance'}>
      <IntervalBar share={null} low={c.low} high={c.high} adjusted={c.value} label={label} className={barClassName} />
      <span className="whitespace-nowrap text-sm tabular-nums">
        {percent(c.value)}
        {c.thin && <span className="ml-1 text-xs italic text-ink/70">· only {plural(c.trees, 'tree')}</span>}
      </span>
    </div>
  );
}

function MarginCell({ v }: { v: VarietyEvidence }) {
  const fit = v.seasonFit;
  return (
    <div className="flex flex-col items-start gap-0.5">
      <span className={`hidden rounded-full px-2 py-0.5 text-xs font-medium whitespace-nowrap sm:inline ${VERDICT_STYLE[fit.verdict]}`}>{LABELS.verdict[fit.verdict]}</span>
      {/* On a phone the verdict is the colour of the margin itself (the words are in the details). */}
      {fit.verdict === 'unknown' && <span className="text-xs text-ink/70 sm:hidden">—</span>}
      {fit.marginDays !== null && (
        <span className={`whitespace-nowrap rounded px-1 text-xs tabular-nums sm:bg-transparent sm:px-0 sm:text-ink/80 ${VERDICT_STYLE[fit.verdict]}`} title={LABELS.verdict[fit.verdict]}>
          {fit.marginDays > 0 ? '+' : ''}
          {Math.round(fit.marginDays)} days
        </span>
      )}
    </div>
  );
}

const column = createColumnHelper<VarietyEvidence>();

/** On a phone the table keeps its key columns (variety, chance, margin); the rest is in the details and the pollination notes. */
const phoneHidden = (columnId: string) => (columnId === 'figType' || columnId === 'rank' || columnId === 'evidence' ? 'hidden md:table-cell' : '');

/** Everything else about one variety here, shown when its row is opened. */
function RowDetails({ v, near }: { v: VarietyEvidence; near: NearResponse }) {
  const units = useUnits();
  const fit = v.seasonFit;
  const ci = v.all.interval90;
  const [dates, setDates] = useState(false);
  return (
    <div className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2" data-testid="variety-details">
      <p className="sm:col-span-2 text-ink/90">{v.reason}</p>
      <div>
        <p className="text-ink/70">Evidence within {units.distance(near.radiusKm)}</p>
        <p>
          {plural(v.all.reports, 'report')} · {plural(Math.round(v.all.trees), 'tree')} · {plural(v.growers, 'grower')}. Ripened on {percent(v.all.share)} of trees
          {ci ? ` (90 % interval ${percent(ci.low)}–${percent(ci.high)})` : ''}
          {v.overallShare !== null ? `; ${percent(v.overallShare)} across the atlas` : ''}.
        </p>
      </div>
      <div>
        <p className="text-ink/70">Season fit ({LABELS.growingForm[fit.form].toLowerCase()})</p>
        <p>
          <strong className="font-medium">{LABELS.verdict[fit.verdict]}</strong>: {fit.localSeasonDays === null ? '—' : Math.round(fit.localSeasonDays)} days here vs {fit.neededDays === null ? '—' : Math.round(fit.neededDays)} needed
          {fit.neededFrom === 'catalogue' ? ' (catalogue class)' : fit.neededFrom === 'reports' ? ' (growers’ reports)' : ''}
          {fit.headStartDays ? `, head start ${fit.headStartDays} days` : ''}.
        </p>
        {fit.localHeatF !== null && fit.neededHeatF !== null && (
          <p data-testid="fit-heat">
            Heat: {fit.localHeatF.toLocaleString()} growing degree days (base 50 °F / 10 °C) here vs {fit.neededHeatF.toLocaleString()} needed
            {fit.limitedBy ? ` · limited by ${fit.limitedBy === 'both' ? 'days and heat' : fit.limitedBy}` : ''}
          </p>
        )}
        <p className="text-xs text-ink/70">{fit.explanation}</p>
      </div>
      <div>
        <p className="text-ink/70">By crop</p>
        <p>
          Breba: {plural(Math.round(v.byCrop.breba.trees), 'tree')}, {percent(v.byCrop.breba.share)} ripened · Main: {plural(Math.round(v.byCrop.main.trees), 'tree')},{' '}
          {percent(v.byCrop.main.share)} ripened
        </p>
      </div>
      <div>
        <p className="text-ink/70">Typical first ripe fig nearby</p>
        <p>{units.dayOfYear(v.medianFirstRipeDoy)}</p>
      </div>
      {v.medianFirstRipeDoy !== null && (
        <div className="sm:col-span-2">
          <button type="button" className="text-sm font-medium text-fig-600 underline" aria-expanded={dates} onClick={() => setDates((s) => !s)}>
            {dates ? 'Hide' : 'Show'} first-ripe dates nearby
          </button>
          {dates && <RipeDatesChart varietyId={v.varietyId} lat={near.point.lat} lon={near.point.lon} radiusKm={near.radiusKm} />}
        </div>
      )}
    </div>
  );
}

/**
 * What ripens here as one compact, sortable comparison: a row per variety, its chance with the
 * interval drawn, evidence and season margin; details open under the row. The pollination check,
 * which depends only on the fig type, is said once per type under the table.
 */
export function VarietyTable({ near, onlyIds }: { near: NearResponse; onlyIds?: Set<number> | null }) {
  const units = useUnits();
  const [sorting, setSorting] = useState<SortingState>([{ id: 'rank', desc: false }]);
  const [open, setOpen] = useState<Set<number>>(new Set());
  const rows = useMemo(() => (onlyIds ? near.varieties.filter((v) => onlyIds.has(v.varietyId)) : near.varieties), [near.varieties, onlyIds]);
  const toggle = (id: number) =>
    setOpen((prev) => {
      const next = new Set(prev);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  const columns = useMemo(
    () => [
      column.accessor('rank', { header: '#', cell: (c) => <span className="tabular-nums text-ink/70">{c.getValue()}</span> }),
      column.accessor('name', {
        header: 'Variety',
        cell: ({ row: { original: v } }) => {
          const blocked = waspBlocked(v, near.pollinationByFigType[v.figType]!);
          return (
            <div className="flex flex-col">
              <VarietyLink id={v.varietyId} name={v.name} className="sm:whitespace-nowrap" />
              <span className="hidden whitespace-nowrap text-xs text-ink/70 sm:inline">
                {v.isFictional ? 'fictional' : ''}
                {blocked ? `${v.isFictional ? ' · ' : ''}needs the wasp` : ''}
              </span>
            </div>
          );
        },
      }),
      column.accessor('figType', {
        header: 'Type, crops',
        cell: ({ row: { original: v } }) => (
          <div className="flex flex-col whitespace-nowrap">
            <span>{FIG_TYPE_SHORT[v.figType]}</span>
            <span className="text-xs text-ink/70">{cropsOf(v)}</span>
          </div>
        ),
      }),
      column.accessor((v) => {
        const c = chanceOf(v);
        return c.tooLittle ? -1 : (c.value ?? -1);
      }, { id: 'chance', header: 'Chance', sortDescFirst: true, cell: ({ row }) => <ChanceCell v={row.original} /> }),
      column.accessor((v) => Math.round(v.all.trees), {
        id: 'evidence',
        header: 'Trees / growers',
        sortDescFirst: true,
        cell: ({ row: { original: v } }) => (
          <span className={`whitespace-nowrap tabular-nums ${Math.round(v.all.trees) <= THIN_TREES ? 'text-ink/70' : ''}`} title={`${plural(Math.round(v.all.trees), 'tree')} from ${plural(v.growers, 'grower')}`}>
            {Math.round(v.all.trees)} / {v.growers}
          </span>
        ),
      }),
      column.accessor((v) => v.seasonFit.marginDays ?? Number.NEGATIVE_INFINITY, { id: 'margin', header: 'Margin', sortDescFirst: true, cell: ({ row }) => <MarginCell v={row.original} /> }),
      column.display({
        id: 'more',
        header: () => <span className="sr-only">Details</span>,
        cell: ({ row: { original: v } }) => (
          <button
            type="button"
            className="whitespace-nowrap rounded border border-fig-100 px-2 py-1 text-sm font-medium text-fig-600 hover:bg-fig-50"
            aria-expanded={open.has(v.varietyId)}
            aria-label={`${open.has(v.varietyId) ? 'Hide' : 'Show'} details of ${v.name}`}
            title="Details"
            onClick={() => toggle(v.varietyId)}
          >
            {open.has(v.varietyId) ? '▴' : '▾'}
          </button>
        ),
      }),
    ],
    [near.pollinationByFigType, open],
  );
  const table = useReactTable({ data: rows, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel(), getRowId: (v) => String(v.varietyId) });

  if (near.varieties.length === 0)
    return <p className="rounded-lg border border-fig-100 bg-white p-4 text-ink/80">No reports of any variety within {units.distance(near.radiusKm)} yet. Try a larger radius.</p>;
  if (rows.length === 0) return <p className="rounded-lg border border-fig-100 bg-white p-4 text-ink/80">None of the varieties reported here passes this filter.</p>;

  const figTypes = [...new Set(rows.map((v) => v.figType))] as FigType[];
  return (
    <div className="flex flex-col gap-3">
      <div className="overflow-x-auto rounded-lg border border-fig-100 bg-white">
        <table className="w-full text-left text-sm" data-testid="variety-table">
          <caption className="sr-only">Varieties reported near this place, ranked; sort by any column, open a row for details</caption>
          <SortableTableHead table={table} className="bg-fig-50 text-ink/70" columnClassName={phoneHidden} />
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <Fragment key={row.id}>
                <tr className="border-t border-fig-100 align-middle" data-testid="variety-row">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className={`px-2 py-2 first:pl-3 ${phoneHidden(cell.column.id)}`}>
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
                {open.has(row.original.varietyId) && (
                  <tr className="bg-paper/60">
                    <td colSpan={row.getVisibleCells().length} className="px-3 py-3">
                      <RowDetails v={row.original} near={near} />
                    </td>
                  </tr>
                )}
              </Fragment>
            ))}
          </tbody>
        </table>
      </div>
      <PollinationNotes near={near} figTypes={figTypes} />
    </div>
  );
}

const expected = (e: 'yes' | 'no' | 'uncertain') => (e === 'yes' ? 'fruit expected' : e === 'no' ? 'no fruit without the wasp' : 'uncertain');

/** The pollination check once per fig type in the table (it depends only on the type and the wasp here). */
export function PollinationNotes({ near, figTypes }: { near: NearResponse; figTypes: FigType[] }) {
  return (
    <section aria-labelledby="pollination-title" className="rounded-lg border border-fig-100 bg-white p-4 text-sm">
      <h3 id="pollination-title" className="font-medium text-fig-900">
        Pollination, by fig type
      </h3>
      <ul className="mt-1 flex flex-col gap-1" data-testid="pollination-notes">
        {figTypes.map((t) => {
          const p = near.pollinationByFigType[t];
          if (!p) return null;
          return (
            <li key={t}>
              <span className="font-medium">{LABELS.figType[t]}</span>: main crop {expected(p.main.fruitExpected)}, breba {expected(p.breba.fruitExpected)}. <span className="text-ink/70">{p.main.explanation}</span>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
