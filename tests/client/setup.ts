import '@testing-library/jest-dom/vitest';
import { cleanup } from '@testing-library/react';
import { afterEach, beforeEach } from 'vitest';

afterEach(() => cleanup());

// Client tests read km and °F in US English unless a test chooses otherwise (useUnits reads this
// before the browser's language; happy-dom's language is en-US, which would mean miles).
beforeEach(() => localStorage.setItem('syconium.units', JSON.stringify({ temperature: 'F', distance: 'km', locale: 'en-US' })));
