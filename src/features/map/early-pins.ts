import { EARLY_PINS_KEY, firstPinsRequest } from './first-view';

/*
 * Not part of the app's bundle: vite.config.ts (earlyPinsScript) builds this module into a classic
 * inline script in index.html's <head>. It asks for the atlas home's first pins as soon as the page
 * is parsed, while the app's JavaScript is still downloading; prefetchFirstPins (first-pins.ts) then
 * takes the answer instead of asking again. Same code as the app's query (first-view.ts, pins-url.ts),
 * so the two URLs agree.
 */
const request = firstPinsRequest(window.location, window.innerWidth, window.innerHeight);
if (request) {
  window[EARLY_PINS_KEY] = {
    url: request.url,
    answer: fetch(request.url, { headers: { Accept: 'application/json' } })
      .then((response) => (response.ok ? response.json() : null))
      .catch(() => null),
  };
}
