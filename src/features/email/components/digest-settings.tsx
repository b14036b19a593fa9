import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import type { z } from 'zod';
import { DIGEST_RADIUS_KM, digestSettingsInputSchema, type DigestSettingsInput } from '@shared/schemas/email';
import { Button } from '../../../components/button';
import { FormField } from '../../../components/form-field';
import { ApiError } from '../../../lib/api-client';
import { useCurrentUser } from '../../auth/api';
import { emailQueries, useUpdateDigest } from '../api';
import { useUnits } from '../../units/use-units';
import { kmToMiles, milesToKm } from '@shared/domain/units';

/** The weekly nearby digest: on or off, and how far from the home place it looks. */
export function DigestSettings() {
  const settings = useQuery(emailQueries.digest());
  const units = useUnits();
  const { user } = useCurrentUser();
  const update = useUpdateDigest();
  const form = useForm<z.input<typeof digestSettingsInputSchema>, unknown, DigestSettingsInput>({
    resolver: zodResolver(digestSettingsInputSchema),
    defaultValues: { active: false, radiusKm: DIGEST_RADIUS_KM.default },
  });
  const { errors, isDirty } = form.formState;
  // The radius is typed in the grower's unit and sent in km (the API stays in SI).
  const miles = units.prefs.distance === 'mi';
  const shown = (km: number) => (miles ? Math.round(kmToMiles(km)) : km);
  const sent = (value: number) => (miles ? Math.round(milesToKm(value) * 10) / 10 : value);
  useEffect(() => {
    if (settings.data) form.reset({ active: settings.data.active, radiusKm: shown(settings.data.radiusKm) });
  }, [settings.data, form, miles]); // eslint-disable-line react-hooks/exhaustive-deps

  if (settings.isLoading) return <p className="text-ink/70">Loading your digest settings…</p>;
  if (settings.error) return <p role="alert" className="text-red-800">{settings.error.message}</p>;
  const data = settings.data!;
  const serverFields = update.error instanceof ApiError ? update.error.fields : {};

  return (
    <section aria-labelledby="digest-heading" className="rounded-lg border border-fig-100 bg-white p-5">
      <h2 id="digest-heading" className="text-lg font-semibold text-fig-900">
        Weekly nearby digest
      </h2>
      <p className="mt-1 text-sm text-ink/80">
        Once a week, an e-mail listing the figs other growers reported as ripened near your home place. Places in it are shown on the public grid of about 5 km (3 miles).
      </p>
      {data.home ? (
        <p className="mt-3 text-sm">
          Centred on your home place <span className="font-medium">{data.home.name}</span>.
        </p>
      ) : (
        <p className="mt-3 rounded-md bg-leaf-100 px-3 py-2 text-sm text-leaf-700">
          Save a home place first: open <Link to="/here" className="font-medium underline">What ripens here</Link>, find your town, then use <strong className="font-medium">Save this place</strong> and tick “Make this my home”.
        </p>
      )}
      <form
        noValidate
        className="mt-4 flex flex-col gap-4"
        onSubmit={form.handleSubmit((input) => update.mutate({ ...input, radiusKm: sent(input.radiusKm) }, { onSuccess: (saved) => form.reset({ active: saved.active, radiusKm: shown(saved.radiusKm) }) }))}
      >
        <label className="flex items-center gap-2 text-sm font-medium">
          <input type="checkbox" className="h-4 w-4 accent-fig-600" disabled={!data.home && !data.active} {...form.register('active')} />
          Send me the weekly digest
        </label>
        {serverFields.active && (
          <p role="alert" className="text-sm text-red-700">
            {serverFields.active[0]}
          </p>
        )}
        <FormField
          label={`Radius (${units.prefs.distance})`}
          type="number"
          inputMode="numeric"
          min={shown(DIGEST_RADIUS_KM.min)}
          max={shown(DIGEST_RADIUS_KM.max)}
          hint={`Reports within this distance of your home place, ${units.distance(DIGEST_RADIUS_KM.min)} to ${units.distance(DIGEST_RADIUS_KM.max)}. ${units.distance(DIGEST_RADIUS_KM.default)} suits most regions.`}
          error={errors.radiusKm?.message ?? serverFields.radiusKm?.[0]}
          {...form.register('radiusKm')}
        />
        <p className="text-xs text-ink/70">
          {data.lastSentAt ? `Last digest covered reports up to ${units.date(data.lastSentAt)}.` : 'No digest sent yet.'}{' '}
          {user && !user.emailVerified && 'Digests start once your e-mail address is confirmed. '}Every digest has an unsubscribe link.
        </p>
        <div className="flex items-center gap-3">
          <Button type="submit" disabled={update.isPending || !isDirty}>
            {update.isPending ? 'Saving…' : 'Save digest settings'}
          </Button>
          {update.isSuccess && !isDirty && <span className="text-sm text-leaf-700">Saved.</span>}
        </div>
      </form>
    </section>
  );
}
