import { useState } from 'react';

/**
 * "Near me": the browser's own location, asked only when pressed, then handed to the map. Sits
 * under a map's zoom buttons (top right) on every map, so the same gesture works everywhere.
 */
export function NearMeButton({ onFound, className = 'top-[4.75rem] right-2.5' }: { onFound: (point: { lat: number; lon: number }) => void; className?: string }) {
  const [note, setNote] = useState<string | null>(null);
  const locate = () => {
    if (!('geolocation' in navigator)) {
      setNote('This browser cannot tell its location.');
      return;
    }
    setNote('Finding you…');
    navigator.geolocation.getCurrentPosition(
      (pos) => {
        setNote(null);
        onFound({ lat: pos.coords.latitude, lon: pos.coords.longitude });
      },
      (err) => setNote(err.code === err.PERMISSION_DENIED ? 'Location was not allowed; search for your town instead.' : 'Your location could not be found.'),
      { enableHighAccuracy: false, timeout: 15_000, maximumAge: 600_000 },
    );
  };
  return (
    <div className={`absolute z-[2] flex flex-col items-end gap-1 ${className}`}>
      <button
        type="button"
        onClick={locate}
        title="Near me"
        aria-label="Near me: move the map to where you are"
        className="grid h-[29px] w-[29px] place-items-center rounded-[4px] bg-white text-fig-700 shadow-[0_0_0_2px_rgba(0,0,0,0.1)] hover:bg-fig-50"
      >
        <svg width="17" height="17" viewBox="0 0 20 20" aria-hidden="true">
          <circle cx="10" cy="10" r="5.2" fill="none" stroke="currentColor" strokeWidth="1.8" />
          <circle cx="10" cy="10" r="1.9" fill="currentColor" />
          <path d="M10 1.5v3.2M10 15.3v3.2M1.5 10h3.2M15.3 10h3.2" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
        </svg>
      </button>
      {note && (
        <p role="status" className="max-w-[12rem] rounded bg-paper/95 px-2 py-1 text-right text-xs text-ink shadow">
          {note}
        </p>
      )}
    </div>
  );
}
