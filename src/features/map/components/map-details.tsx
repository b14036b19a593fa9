import { useEffect, useRef, useSyncExternalStore, type ReactNode } from 'react';
import { createPortal } from 'react-dom';
import { Popup } from 'react-map-gl/maplibre';

const PHONE_QUERY = '(max-width: 767px)';

function usePhoneLayout(): boolean {
  return useSyncExternalStore(
    (onChange) => {
      const query = window.matchMedia(PHONE_QUERY);
      query.addEventListener('change', onChange);
      return () => query.removeEventListener('change', onChange);
    },
    () => window.matchMedia(PHONE_QUERY).matches,
  );
}

interface MapDetailsProps {
  latitude: number;
  longitude: number;
  onClose: () => void;
  titleId: string;
  children: ReactNode;
}

/**
 * What a click on the map opens. On a desktop, a popup beside the spot (our type, a visible scroll
 * bar when long). On a phone, a sheet from the bottom of the screen, above every control of the
 * page (a popup there opened under the search bar and the filters button), scrolling inside, with
 * its close button always in view.
 */
export function MapDetails({ latitude, longitude, onClose, titleId, children }: MapDetailsProps) {
  const phone = usePhoneLayout();
  const sheetRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!phone) return;
    sheetRef.current?.focus();
    const onKey = (e: KeyboardEvent) => e.key === 'Escape' && onClose();
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [phone, onClose, latitude, longitude]);

  if (!phone) {
    return (
      <Popup latitude={latitude} longitude={longitude} onClose={onClose} closeOnClick={false} maxWidth="320px" focusAfterOpen className="syconium-popup">
        <div className="syconium-popup-body">{children}</div>
      </Popup>
    );
  }
  return createPortal(
    <div
      ref={sheetRef}
      role="dialog"
      aria-modal="false"
      aria-labelledby={titleId}
      tabIndex={-1}
      data-testid="map-sheet"
      className="fixed inset-x-0 bottom-0 z-[60] flex max-h-[min(62dvh,calc(100dvh-7rem))] flex-col rounded-t-2xl border-t border-fig-100 bg-paper font-sans shadow-[0_-6px_24px_rgba(43,34,48,0.18)] outline-none"
    >
      <div className="flex shrink-0 items-center justify-between px-4 pt-2 pb-1">
        <span aria-hidden className="mx-auto h-1 w-10 rounded-full bg-ink/20" />
      </div>
      <button
        type="button"
        onClick={onClose}
        aria-label="Close details"
        className="absolute top-2 right-2 grid h-9 w-9 place-items-center rounded-full text-lg text-ink/70 hover:bg-fig-50"
      >
        ×
      </button>
      <div className="min-h-0 flex-1 overflow-y-auto overscroll-contain px-4 pb-[max(1rem,env(safe-area-inset-bottom))]">{children}</div>
    </div>,
    document.body,
  );
}
