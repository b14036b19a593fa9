import type { Crop, FigType } from './codes';
import type { PollinationCheck, PollinationChecks } from '../schemas/atlas';

/**
 * Whether a crop of a fig type can be expected to ripen without the grower arranging caprification
 * (pollination by the fig wasp, Blastophaga psenes, carried from caprifigs).
 *
 * The four horticultural types (Texas A&M AgriLife Extension EHT-019, "Figs"; I. J. Condit, "Fig
 * Varieties: A Monograph", Hilgardia 23(11), 1955):
 * - common: both crops set without pollination (some varieties drop their breba crop);
 * - San Pedro: the breba sets without pollination; the main crop drops unless caprified;
 * - Smyrna: fruit matures only after caprification;
 * - caprifig: the inedible type that hosts the wasp.
 *
 * `waspEstablished` means editors recorded the wasp as established where the point lies. There a
 * crop that needs the wasp can be expected (`yes`), with a note that it depends on caprifigs nearby.
 * `unknown` fig types stay `uncertain`. `needsWasp` is null where the question does not apply
 * (caprifig, unknown type).
 */
export function pollinationCheck(figType: FigType, crop: Crop, waspEstablished: boolean): PollinationCheck {
  const base = { figType, crop, waspEstablished };
  const waspHere = 'The fig wasp is recorded as established here, so it can pollinate the fruit when caprifig trees grow nearby.';
  const noWasp = 'No area where the fig wasp is established is recorded here.';
  switch (figType) {
    case 'common':
      return {
        ...base,
        needsWasp: false,
        fruitExpected: 'yes',
        explanation:
          crop === 'breba'
            ? 'Common figs set fruit without pollination. Some common varieties shed their breba crop, so look at the reports for this one.'
            : 'Common figs set their main crop without pollination, so no wasp is needed.',
      };
    case 'san-pedro':
      if (crop === 'breba') {
        return {
          ...base,
          needsWasp: false,
          fruitExpected: 'yes',
          explanation: 'San Pedro figs set their breba crop without pollination.',
        };
      }
      return {
        ...base,
        needsWasp: true,
        fruitExpected: waspEstablished ? 'yes' : 'no',
        explanation: waspEstablished
          ? `A San Pedro fig's main crop needs the fig wasp. ${waspHere}`
          : `A San Pedro fig's main crop usually drops unless the fig wasp pollinates it. ${noWasp} Expect the breba crop only.`,
      };
    case 'smyrna':
      return {
        ...base,
        needsWasp: true,
        fruitExpected: waspEstablished ? 'yes' : 'no',
        explanation: waspEstablished
          ? `Smyrna figs ripen only after the fig wasp pollinates them. ${waspHere}`
          : `Smyrna figs ripen only after the fig wasp pollinates them; without it the young fruit drops. ${noWasp}`,
      };
    case 'caprifig':
      return {
        ...base,
        needsWasp: null,
        fruitExpected: 'no',
        explanation: 'A caprifig is the host tree of the wasp: its fruit is dry and not for eating. It is grown to pollinate Smyrna and San Pedro figs.',
      };
    case 'unknown':
      return {
        ...base,
        needsWasp: null,
        fruitExpected: 'uncertain',
        explanation: waspEstablished
          ? `The fig type of this variety is not known, so whether it needs pollination is uncertain. ${waspHere}`
          : `The fig type of this variety is not known, so whether it needs the fig wasp is uncertain. ${noWasp}`,
      };
  }
}

const checksMade = new Map<string, PollinationChecks>();

/**
 * Both crops at once, in the shape VarietyEvidence and FitResponse carry. There are ten possible
 * answers; each is made once and shared (frozen), since a near answer asks for dozens.
 */
export function pollinationChecks(figType: FigType, waspEstablished: boolean): PollinationChecks {
  const key = `${figType}|${waspEstablished}`;
  let checks = checksMade.get(key);
  if (!checks) {
    checks = Object.freeze({
      breba: Object.freeze(pollinationCheck(figType, 'breba', waspEstablished)),
      main: Object.freeze(pollinationCheck(figType, 'main', waspEstablished)),
    });
    checksMade.set(key, checks);
  }
  return checks;
}
