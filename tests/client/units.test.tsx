import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { authQueries } from '../../src/features/auth/api';
import { useUnits } from '../../src/features/units/use-units';

function Probe() {
  const u = useUnits();
  return (
    <p data-testid="probe">
      {u.distance(100)} | {u.temperature(32)} | {u.date('2025-05-07')} | {u.dayOfYear(119)} | {u.source}
      <button type="button" onClick={() => u.setPrefs({ ...u.prefs, distance: 'mi' })}>
        miles
      </button>
    </p>
  );
}

function setup() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
  client.setQueryData(authQueries.me().queryKey, { user: null });
  return render(
    <QueryClientProvider client={client}>
      <Probe />
    </QueryClientProvider>,
  );
}

describe('useUnits', () => {
  afterEach(() => vi.restoreAllMocks());

  it('starts from the browser’s language when nothing is chosen: fr-FR reads km, °C and French dates', () => {
    localStorage.removeItem('syconium.units');
    vi.spyOn(navigator, 'language', 'get').mockReturnValue('fr-FR');
    setup();
    // CLDR medium date for fr: "d MMM y" → "7 mai 2025"; 32 °F = 0 °C (NIST SP 811).
    expect(screen.getByTestId('probe')).toHaveTextContent('100 km | 0 °C | 7 mai 2025 | 29 avr. | default');
  });

  it('keeps a visitor’s choice in this browser, and every open view follows it at once', () => {
    localStorage.removeItem('syconium.units');
    vi.spyOn(navigator, 'language', 'get').mockReturnValue('en-US');
    setup();
    expect(screen.getByTestId('probe')).toHaveTextContent('62 mi | 32 °F | May 7, 2025 | Apr 29 | default');
    localStorage.setItem('syconium.units', JSON.stringify({ temperature: 'C', distance: 'km', locale: 'en-GB' }));
    act(() => window.dispatchEvent(new StorageEvent('storage', { key: 'syconium.units' })));
    expect(screen.getByTestId('probe')).toHaveTextContent('100 km | 0 °C | 7 May 2025 | 29 Apr | browser');
    act(() => screen.getByRole('button', { name: 'miles' }).click());
    expect(screen.getByTestId('probe')).toHaveTextContent('62 mi | 0 °C');
    expect(JSON.parse(localStorage.getItem('syconium.units')!)).toEqual({ temperature: 'C', distance: 'mi', locale: 'en-GB' });
  });
});
