import { useState } from 'react';
import type { GrowingForm } from '@shared/domain/codes';
import { Button } from '../../../components/button';
import { FormField } from '../../../components/form-field';
import { ApiError } from '../../../lib/api-client';
import { useSavePlace } from '../api';

/** "Save this place": a name and whether it is home; the form comes from the page. */
export function SavePlaceForm({ lat, lon, form }: { lat: number; lon: number; form: GrowingForm }) {
  const [open, setOpen] = useState(false);
  const [name, setName] = useState('');
  const [isHome, setIsHome] = useState(false);
  const save = useSavePlace();
  const fieldError = save.error instanceof ApiError ? save.error.fields : {};

  if (save.isSuccess && !open) return <p className="text-sm text-leaf-700" role="status">Saved “{save.data.place.name}”{save.data.place.isHome ? ' as your home' : ''}.</p>;
  if (!open)
    return (
      <Button type="button" variant="secondary" onClick={() => setOpen(true)}>
        Save this place
      </Button>
    );
  return (
    <form
      className="flex flex-col gap-3 rounded-lg border border-fig-100 bg-white p-4"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate({ name, lat, lon, form, isHome }, { onSuccess: () => setOpen(false) });
      }}
    >
      <FormField label="Name of the place" hint="Only you see your saved places." value={name} onChange={(e) => setName(e.target.value)} error={fieldError.name?.[0]} maxLength={80} />
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" checked={isHome} onChange={(e) => setIsHome(e.target.checked)} />
        Make this my home (the atlas opens here)
      </label>
      {save.error && !fieldError.name && <p className="text-sm text-red-700">{save.error.message}</p>}
      <div className="flex gap-2">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save'}
        </Button>
        <Button type="button" variant="quiet" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
