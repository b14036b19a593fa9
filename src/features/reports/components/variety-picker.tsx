import { useQuery } from '@tanstack/react-query';
import { useEffect, useId, useState } from 'react';
import { LABELS } from '@shared/domain/codes';
import { reportQueries } from '../api';
import { describedBy, HintAndError, inputClass } from '../../../components/form-field';

const VARIETY_HINT = 'Pick the name on the label or from the person who gave you the plant. Unsure? Choose the closest match and say so in the notes.';

interface VarietyPickerProps {
  varietyId: number | null;
  varietyName: string | null;
  proposedName: string | null;
  onChoose: (variety: { id: number; name: string } | null) => void;
  onPropose: (name: string | null) => void;
  error?: string;
  proposeError?: string;
}

/** Search the catalogue by name or synonym; when a variety is not listed, propose its name for editors. */
export function VarietyPicker({ varietyId, varietyName, proposedName, onChoose, onPropose, error, proposeError }: VarietyPickerProps) {
  const id = useId();
  const [text, setText] = useState('');
  const [debounced, setDebounced] = useState('');
  const [proposing, setProposing] = useState(proposedName !== null);
  useEffect(() => {
    const timer = setTimeout(() => setDebounced(text.trim()), 250);
    return () => clearTimeout(timer);
  }, [text]);
  const search = useQuery({ ...reportQueries.varieties(debounced), enabled: debounced.length >= 1 && varietyId === null && !proposing });
  const results = search.data?.varieties.slice(0, 8) ?? [];

  if (varietyId !== null && !proposing) {
    return (
      <div className="flex flex-col gap-1">
        <span className="text-sm font-medium text-ink">Variety</span>
        <div className="flex items-center gap-3 rounded-md border border-leaf-300 bg-leaf-100/60 px-3 py-2">
          <span className="font-medium text-leaf-700">{varietyName ?? `Variety #${varietyId}`}</span>
          <button type="button" className="ml-auto text-sm text-fig-700 underline" onClick={() => onChoose(null)}>
            Change
          </button>
        </div>
      </div>
    );
  }

  if (proposing) {
    return (
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-propose`} className="text-sm font-medium text-ink">
          Proposed variety name
        </label>
        <input
          id={`${id}-propose`}
          className={inputClass}
          value={proposedName ?? ''}
          aria-invalid={proposeError ? true : undefined}
          onChange={(e) => onPropose(e.target.value)}
          placeholder="The name your tree came with"
        />
        <p className="text-xs text-ink/70">Editors check new names against the catalogue; your report counts as soon as it is published and is linked to the name editors settle on.</p>
        {proposeError && (
          <p role="alert" className="text-sm text-red-700">
            {proposeError}
          </p>
        )}
        <button
          type="button"
          className="self-start text-sm text-fig-700 underline"
          onClick={() => {
            setProposing(false);
            onPropose(null);
          }}
        >
          Search the catalogue instead
        </button>
      </div>
    );
  }

  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={`${id}-search`} className="text-sm font-medium text-ink">
        Variety
      </label>
      <input
        id={`${id}-search`}
        className={inputClass}
        type="search"
        role="combobox"
        aria-expanded={results.length > 0}
        aria-controls={`${id}-results`}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, VARIETY_HINT, error)}
        autoComplete="off"
        placeholder="Type a name or a synonym"
        value={text}
        onChange={(e) => setText(e.target.value)}
      />
      {results.length > 0 && (
        <ul id={`${id}-results`} role="listbox" aria-label="Matching varieties" className="max-h-64 overflow-y-auto rounded-md border border-fig-100 bg-white shadow-sm">
          {results.map((variety) => (
            <li key={variety.id} role="option" aria-selected={false}>
              <button type="button" className="flex w-full flex-col items-start px-3 py-2 text-left hover:bg-fig-50" onClick={() => onChoose({ id: variety.id, name: variety.name })}>
                <span className="font-medium">
                  {variety.name}
                  {variety.isFictional && <span className="ml-2 text-xs font-normal text-ink/70">fictional</span>}
                </span>
                <span className="text-xs text-ink/70">
                  {LABELS.figType[variety.figType]}
                  {variety.synonyms.length > 0 && ` · also called ${variety.synonyms.join(', ')}`}
                </span>
              </button>
            </li>
          ))}
        </ul>
      )}
      {debounced && search.isSuccess && results.length === 0 && <p className="text-sm text-ink/70">No listed variety matches “{debounced}”.</p>}
      <HintAndError id={id} hint={VARIETY_HINT} error={error} />
      <button
        type="button"
        className="self-start text-sm text-fig-700 underline"
        onClick={() => {
          setProposing(true);
          onPropose(text.trim() || '');
        }}
      >
        Not listed? Propose a name
      </button>
    </div>
  );
}
