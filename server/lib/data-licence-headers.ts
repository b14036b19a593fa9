import type { Response } from 'express';
import { DATA_LICENCE, DATA_LICENCE_NOTICE } from '../../shared/domain/data-licence';

/**
 * Every export of published reports says its licence in the response: a `Link` with the registered
 * "license" relation (RFC 8288 / IANA link relations) to the licence text, and the plain notice with
 * the credit to give, for a CSV that has no place of its own for it.
 */
export function setLicenceHeaders(res: Response): void {
  res.setHeader('Link', `<${DATA_LICENCE.url}>; rel="license"`);
  res.setHeader('X-Data-Licence', DATA_LICENCE_NOTICE);
}
