import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState, type ReactNode } from 'react';
import { Link } from 'react-router';
import { FIG_TYPES, GROWING_FORMS, LABELS } from '@shared/domain/codes';
import { diagnose, localDataFrom, questionsFor, type QuestionKey } from '@shared/domain/diagnosis';
import {
  CROP_SEEN,
  FEEDING_PATTERNS,
  PINCHING_PATTERNS,
  SUN_LEVELS,
  SYMPTOMS,
  WATERING_PATTERNS,
  diagnosisAnswersSchema,
  type DiagnosisAnswers,
  type Symptom,
} from '@shared/schemas/diagnosis';
import { Button } from '../../../components/button';
import { useCurrentUser } from '../../auth/api';
import { savedPlaceQueries } from '../../places/api';
import { PlaceSearch, placeLabel, useResolvePlace } from '../../places/components/place-search';
import { guidanceQueries } from '../api';
import { CauseList } from './cause-list';
import { CautionBox } from './caution-box';
import { countOf } from '@shared/domain/plural';

const SYMPTOM_TEXT: Record<Symptom, { title: string; hint: string }> = {
  'no-fruit': { title: 'No fruit formed', hint: 'The tree grew leaves but no little figs appeared.' },
  dropped: { title: 'Fruit formed, then dropped', hint: 'Small figs appeared, then yellowed or fell before ripening.' },
  unripe: { title: 'Fruit stayed hard and green until frost', hint: 'Plenty of figs, but they never softened before the cold came.' },
};

const CHOICES = {
  crop: { breba: 'Breba: early figs on last year’s wood', main: 'Main crop: figs on this year’s new shoots', both: 'Both crops', unsure: 'Not sure' },
  sun: { full: 'Full sun: six hours or more of direct sun', part: 'Part sun: three to six hours', shade: 'Mostly shade: under three hours' },
  watering: { even: 'Evenly moist, watered in dry spells', 'dry-spells': 'It dried out between waterings', soggy: 'Soil stayed wet or waterlogged', unsure: 'Not sure' },
  feeding: { balanced: 'A light, balanced feed', none: 'Not fed at all', 'heavy-nitrogen': 'Fed generously, rich in nitrogen (lawn feed, fresh manure)', unsure: 'Not sure' },
  pinching: { 'early-summer': 'Yes, in early summer', 'late-summer': 'Yes, but in late summer', no: 'No', unsure: 'Not sure' },
} as const satisfies {
  crop: Record<(typeof CROP_SEEN)[number], string>;
  sun: Record<(typeof SUN_LEVELS)[number], string>;
  watering: Record<(typeof WATERING_PATTERNS)[number], string>;
  feeding: Record<(typeof FEEDING_PATTERNS)[number], string>;
  pinching: Record<(typeof PINCHING_PATTERNS)[number], string>;
};

const TITLES: Record<QuestionKey, string> = {
  variety: 'Which variety is it?',
  crop: 'Which crop did you watch?',
  treeAge: 'How old is the tree?',
  origin: 'How did the tree start?',
  form: 'How is it grown?',
  sun: 'How much sun and warmth does it get?',
  watering: 'How was the watering this summer?',
  feeding: 'How was it fed?',
  pinching: 'Did you pinch the shoot tips?',
  place: 'Where do you grow it? (optional)',
};

type Draft = Partial<DiagnosisAnswers> & { symptom?: Symptom };

/** What an unanswered question counts as ("not sure", full sun, in the ground): shown selected. */
const DEFAULTS = diagnosisAnswersSchema.parse({ symptom: 'no-fruit' });

/** Radio choices, named for screen readers by the question's heading unless a legend of their own is given. */
function Choice<T extends string>({ name, legend, value, options, onChange }: { name: string; legend?: string; value: T | undefined; options: Record<T, string>; onChange: (v: T) => void }) {
  return (
    <fieldset className="flex flex-col gap-2" aria-labelledby={legend ? undefined : 'q-title'}>
      {legend && <legend className="mb-1 text-sm font-medium">{legend}</legend>}
      {(Object.keys(options) as T[]).map((key) => (
        <label key={key} className={`flex cursor-pointer items-center gap-3 rounded-md border px-3 py-2 ${value === key ? 'border-fig-500 bg-fig-50' : 'border-fig-100 bg-white hover:bg-fig-50'}`}>
          <input type="radio" name={name} value={key} checked={value === key} onChange={() => onChange(key)} className="h-4 w-4 shrink-0 accent-fig-600" />
          {options[key]}
        </label>
      ))}
    </fieldset>
  );
}

/** "Why no figs?": from what the grower saw, only the questions that matter, then likely causes. */
export function DiagnosisStepper() {
  const [draft, setDraft] = useState<Draft>({});
  const [step, setStep] = useState(0); // 0 = what did you see; 1..n = questions; n+1 = result
  const [place, setPlace] = useState<{ lat: number; lon: number; name: string } | null>(null);
  const set = (patch: Draft) => setDraft((d) => ({ ...d, ...patch }));
  // A town typed but not picked is looked up when the grower moves on, never dropped.
  const [pendingTown, setPendingTown] = useState<string | null>(null);
  const [townProblem, setTownProblem] = useState<string | null>(null);
  const resolveTown = useResolvePlace();
  const next = async () => {
    if (question === 'place' && pendingTown) {
      const found = await resolveTown(pendingTown).catch(() => null);
      if (!found) {
        setTownProblem(`No town called “${pendingTown}” was found. Pick one from the list, or clear the box to go on without a place.`);
        return;
      }
      setPlace({ lat: found.lat, lon: found.lon, name: placeLabel(found) });
    }
    setTownProblem(null);
    setStep(step + 1);
  };
  // Each step replaces the button just pressed: move focus to the new step's heading so keyboard and
  // screen-reader users continue from the question, not from the top of the page.
  const stepsRef = useRef<HTMLDivElement>(null);
  const movedOn = useRef(false);
  useEffect(() => {
    if (!movedOn.current) {
      movedOn.current = true;
      return;
    }
    stepsRef.current?.querySelector<HTMLElement>('h2')?.focus();
  }, [step]);

  const questions = draft.symptom ? questionsFor(draft.symptom) : [];
  const total = questions.length;
  const atResult = draft.symptom !== undefined && step > total;
  const question = step >= 1 && step <= total ? questions[step - 1]! : null;

  return (
    <div ref={stepsRef} className="flex flex-col gap-5">
      {draft.symptom && (
        <div aria-label="Progress" className="flex items-center gap-3 text-sm text-ink/70">
          <div className="h-1.5 flex-1 overflow-hidden rounded-full bg-fig-50">
            <div className="h-full bg-fig-500 transition-all" style={{ width: `${(Math.min(step, total + 1) / (total + 1)) * 100}%` }} />
          </div>
          <span>{atResult ? 'Result' : `Step ${step + 1} of ${total + 1}`}</span>
        </div>
      )}

      {step === 0 && (
        <section aria-labelledby="q-symptom">
          <h2 id="q-symptom" tabIndex={-1} className="focus:outline-none text-lg font-semibold text-fig-900">
            What did you see this season?
          </h2>
          <div className="mt-3 grid gap-3 sm:grid-cols-3">
            {SYMPTOMS.map((s) => (
              <button
                key={s}
                type="button"
                onClick={() => {
                  set({ symptom: s });
                  setStep(1);
                }}
                className={`flex flex-col justify-start rounded-lg border p-4 text-left hover:border-fig-500 hover:bg-fig-50 ${draft.symptom === s ? 'border-fig-500 bg-fig-50' : 'border-fig-100 bg-white'}`}
              >
                <span className="block font-medium text-fig-900">{SYMPTOM_TEXT[s].title}</span>
                <span className="mt-1 block text-sm text-ink/70">{SYMPTOM_TEXT[s].hint}</span>
              </button>
            ))}
          </div>
        </section>
      )}

      {question && (
        <section aria-labelledby="q-title" className="flex flex-col gap-3">
          <h2 id="q-title" tabIndex={-1} className="focus:outline-none text-lg font-semibold text-fig-900">
            {TITLES[question]}
          </h2>
          <QuestionBody question={question} draft={draft} set={set} place={place} setPlace={setPlace} onPendingTown={setPendingTown} />
          {townProblem && pendingTown && (
            <p role="alert" className="text-sm text-red-700">
              {townProblem}
            </p>
          )}
          <div className="flex gap-2">
            <Button type="button" variant="secondary" onClick={() => setStep(step - 1)}>
              Back
            </Button>
            <Button type="button" onClick={() => void next()}>
              {step === total ? 'See likely causes' : 'Next'}
            </Button>
          </div>
        </section>
      )}

      {atResult && (
        <DiagnosisResult
          answers={diagnosisAnswersSchema.parse(draft)}
          place={place}
          onRestart={() => {
            setDraft({});
            setPlace(null);
            setStep(0);
          }}
          onBack={() => setStep(total)}
        />
      )}
    </div>
  );
}

function QuestionBody({
  question,
  draft,
  set,
  place,
  setPlace,
  onPendingTown,
}: {
  question: QuestionKey;
  draft: Draft;
  set: (p: Draft) => void;
  place: { lat: number; lon: number; name: string } | null;
  setPlace: (p: { lat: number; lon: number; name: string } | null) => void;
  onPendingTown: (text: string | null) => void;
}) {
  switch (question) {
    case 'variety':
      return <VarietyQuestion draft={draft} set={set} />;
    case 'crop':
      return <Choice name="crop" value={draft.crop ?? DEFAULTS.crop} options={CHOICES.crop} onChange={(crop) => set({ crop })} />;
    case 'treeAge':
      return (
        <div className="flex flex-col gap-1">
          <label htmlFor="tree-age" className="text-sm font-medium">
            Years since it was planted or rooted
          </label>
          <input
            id="tree-age"
            type="number"
            min={0}
            max={200}
            value={draft.treeAgeYears ?? ''}
            onChange={(e) => set({ treeAgeYears: e.target.value === '' ? null : Math.max(0, Math.min(200, Number(e.target.value))) })}
            className="w-32 rounded-md border border-fig-200 px-3 py-2"
          />
          <p className="text-xs text-ink/70">Leave empty if you do not know. Count the years it has grown in your care, plus its age when you got it.</p>
        </div>
      );
    case 'origin':
      return <Choice name="origin" value={draft.origin ?? DEFAULTS.origin} options={LABELS.plantOrigin} onChange={(origin) => set({ origin })} />;
    case 'form':
      return <Choice name="form" value={draft.form ?? DEFAULTS.form} options={Object.fromEntries(GROWING_FORMS.map((f) => [f, LABELS.growingForm[f]])) as Record<(typeof GROWING_FORMS)[number], string>} onChange={(form) => set({ form })} />;
    case 'sun':
      return (
        <>
          <Choice name="sun" value={draft.sun ?? DEFAULTS.sun} options={CHOICES.sun} onChange={(sun) => set({ sun })} />
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={draft.warmSpot ?? false} onChange={(e) => set({ warmSpot: e.target.checked })} />
            It stands in a warm spot: against a sunny wall or paving, sheltered from cold wind
          </label>
        </>
      );
    case 'watering':
      return <Choice name="watering" value={draft.watering ?? DEFAULTS.watering} options={CHOICES.watering} onChange={(watering) => set({ watering })} />;
    case 'feeding':
      return <Choice name="feeding" value={draft.feeding ?? DEFAULTS.feeding} options={CHOICES.feeding} onChange={(feeding) => set({ feeding })} />;
    case 'pinching':
      return (
        <>
          <p className="text-sm text-ink/80">Pinching means nipping off the soft tip of each growing shoot, so the tree ripens the figs it has instead of growing longer.</p>
          <Choice name="pinching" value={draft.pinching ?? DEFAULTS.pinching} options={CHOICES.pinching} onChange={(pinching) => set({ pinching })} />
          <CautionBox kinds={['latex']} />
        </>
      );
    case 'place':
      return <PlaceQuestion place={place} setPlace={setPlace} onPendingText={onPendingTown} />;
  }
}

function VarietyQuestion({ draft, set }: { draft: Draft; set: (p: Draft) => void }) {
  const { data } = useQuery(guidanceQueries.varieties());
  const eating = (data?.varieties ?? []).filter((v) => v.status === 'accepted');
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-1">
        <label htmlFor="variety" className="text-sm font-medium">
          Variety
        </label>
        <select
          id="variety"
          value={draft.varietyId ?? ''}
          onChange={(e) => {
            const v = eating.find((x) => x.id === Number(e.target.value));
            set({ varietyId: v ? v.id : null, ...(v ? { figType: v.figType } : {}) });
          }}
          className="rounded-md border border-fig-200 bg-white px-3 py-2"
        >
          <option value="">I don’t know / not listed</option>
          {eating.map((v) => (
            <option key={v.id} value={v.id}>
              {v.name}
              {v.isFictional ? ' (fictional demo)' : ''}
            </option>
          ))}
        </select>
        <p className="text-xs text-ink/70">Choosing it fills in its type, and lets us compare with how it did near you.</p>
      </div>
      <div>
        <Choice name="figType" legend="Its type" value={draft.figType ?? DEFAULTS.figType} options={Object.fromEntries(FIG_TYPES.map((t) => [t, LABELS.figType[t]])) as Record<(typeof FIG_TYPES)[number], string>} onChange={(figType) => set({ figType })} />
      </div>
    </div>
  );
}

function PlaceQuestion({
  place,
  setPlace,
  onPendingText,
}: {
  place: { lat: number; lon: number; name: string } | null;
  setPlace: (p: { lat: number; lon: number; name: string } | null) => void;
  onPendingText: (text: string | null) => void;
}) {
  const { user } = useCurrentUser();
  const saved = useQuery({ ...savedPlaceQueries.list(), enabled: !!user });
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-ink/80">With a place, we add its frost-free season, whether the fig wasp lives there, and how your variety did nearby. You can skip this.</p>
      {place && (
        <p className="rounded-md bg-leaf-100 px-3 py-2 text-sm" role="status">
          Using {place.name}.{' '}
          <button type="button" className="underline" onClick={() => setPlace(null)}>
            Remove
          </button>
        </p>
      )}
      {saved.data && saved.data.places.length > 0 && (
        <div className="flex flex-wrap gap-2">
          {saved.data.places.map((p) => (
            <Button key={p.id} type="button" variant="secondary" className="!px-3 !py-1" onClick={() => setPlace({ lat: p.lat, lon: p.lon, name: p.name })}>
              {p.isHome ? '⌂ ' : ''}
              {p.name}
            </Button>
          ))}
        </div>
      )}
      <PlaceSearch
        onPick={(p) => setPlace({ lat: p.lat, lon: p.lon, name: placeLabel(p) })}
        onPendingText={onPendingText}
        hint="Type two letters or more, then pick a town (Enter takes the best match)."
      />
    </div>
  );
}

function DiagnosisResult({ answers, place, onRestart, onBack }: { answers: DiagnosisAnswers; place: { lat: number; lon: number; name: string } | null; onRestart: () => void; onBack: () => void }) {
  const point = place ? { lat: place.lat, lon: place.lon, radiusKm: 100, form: answers.form } : null;
  const near = useQuery({ ...guidanceQueries.near(point ?? { lat: 0, lon: 0, radiusKm: 100, form: 'ground' }), enabled: !!point, retry: false });
  const fit = useQuery({ ...guidanceQueries.fit(answers.varietyId ?? 0, point ?? { lat: 0, lon: 0, radiusKm: 100, form: 'ground' }), enabled: !!point && answers.varietyId !== null, retry: false });
  const loading = (!!point && near.isLoading) || (!!point && answers.varietyId !== null && fit.isLoading);
  if (loading) return <p role="status">Looking up your place in the atlas…</p>;
  const local = localDataFrom(near.data, fit.data, answers.varietyId);
  const causes = diagnose(answers, local);
  const localNote: ReactNode = !point ? (
    'Without a place, this rests on your answers alone.'
  ) : near.error ? (
    `We could not read the atlas for ${place!.name} (${near.error.message}), so this rests on your answers alone.`
  ) : (
    <>
      For {place!.name}: {local.seasonDays50 !== null ? `about ${Math.round(local.seasonDays50)} frost-free days in a typical year` : 'no season data in range'}; the fig wasp is{' '}
      {local.waspEstablished ? 'recorded' : 'not recorded'} there
      {local.varietyTrees !== null ? `; ${countOf(local.varietyTrees, 'tree')} of your variety ${local.varietyTrees === 1 ? 'was' : 'were'} reported nearby` : ''}.
    </>
  );
  return (
    <section aria-labelledby="result-title" className="flex flex-col gap-4">
      <div>
        <h2 id="result-title" tabIndex={-1} className="focus:outline-none text-xl font-semibold text-fig-900">
          Likely causes, most likely first
        </h2>
        <p className="mt-1 text-sm text-ink/70">
          {SYMPTOM_TEXT[answers.symptom].title}. {localNote}
        </p>
      </div>
      <CauseList causes={causes} />
      {/* Each cause carries the cautions its advice needs; this note is about the check itself. */}
      <p className="text-xs text-ink/70">This check gives likely causes from common growing practice and the atlas’s reports; it is not a diagnosis of pests or disease. Your local extension service can look at your tree.</p>
      <div className="flex flex-wrap gap-2">
        <Button type="button" variant="secondary" onClick={onBack}>
          Change my answers
        </Button>
        <Button type="button" variant="quiet" onClick={onRestart}>
          Start again
        </Button>
        {place && (
          <Link to={`/here?${new URLSearchParams({ lat: String(place.lat), lon: String(place.lon), form: answers.form })}`} className="self-center text-sm font-medium text-fig-600 underline">
            What ripens at {place.name.split(',')[0]}
          </Link>
        )}
      </div>
    </section>
  );
}
