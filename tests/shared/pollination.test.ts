import { describe, expect, it } from 'vitest';
import { FIG_TYPES, CROPS } from '../../shared/domain/codes';
import { pollinationCheck, pollinationChecks } from '../../shared/domain/pollination';
import { pollinationCheckSchema } from '../../shared/schemas/atlas';

describe('pollinationCheck', () => {
  it('needs no wasp for a common fig, either crop', () => {
    // Texas A&M AgriLife Extension EHT-019 "Figs"; Condit 1955, Hilgardia 23(11): common figs develop without pollination.
    for (const crop of CROPS) {
      expect(pollinationCheck('common', crop, false)).toMatchObject({ needsWasp: false, fruitExpected: 'yes' });
    }
    // Same sources: some common varieties drop their breba crop; the explanation says so.
    expect(pollinationCheck('common', 'breba', false).explanation).toMatch(/breba/);
  });

  it('sets a San Pedro breba alone but not its main crop without the wasp', () => {
    // Texas A&M EHT-019; Condit 1955: San Pedro breba sets without pollination, the main crop drops unless caprified.
    expect(pollinationCheck('san-pedro', 'breba', false)).toMatchObject({ needsWasp: false, fruitExpected: 'yes' });
    expect(pollinationCheck('san-pedro', 'main', false)).toMatchObject({ needsWasp: true, fruitExpected: 'no' });
    expect(pollinationCheck('san-pedro', 'main', true)).toMatchObject({ needsWasp: true, fruitExpected: 'yes' });
  });

  it('needs the wasp for a Smyrna fig', () => {
    // Texas A&M EHT-019; Condit 1955: Smyrna fruit matures only after caprification.
    expect(pollinationCheck('smyrna', 'main', false)).toMatchObject({ needsWasp: true, fruitExpected: 'no' });
    expect(pollinationCheck('smyrna', 'main', true)).toMatchObject({ needsWasp: true, fruitExpected: 'yes' });
    expect(pollinationCheck('smyrna', 'main', true).explanation).toMatch(/caprifig/);
  });

  it('calls a caprifig inedible and an unknown type uncertain', () => {
    // Texas A&M EHT-019; Condit 1955: the caprifig is the inedible host of Blastophaga psenes.
    expect(pollinationCheck('caprifig', 'main', true)).toMatchObject({ fruitExpected: 'no', needsWasp: null });
    expect(pollinationCheck('caprifig', 'main', true).explanation).toMatch(/not for eating/);
    expect(pollinationCheck('unknown', 'main', false)).toMatchObject({ fruitExpected: 'uncertain', needsWasp: null });
  });

  it('gives the wire shape for every type, crop and wasp status', () => {
    for (const figType of FIG_TYPES) {
      for (const crop of CROPS) {
        for (const wasp of [true, false]) {
          const check = pollinationCheckSchema.parse(pollinationCheck(figType, crop, wasp));
          expect(check).toMatchObject({ figType, crop, waspEstablished: wasp });
          expect(check.explanation.length).toBeGreaterThan(20);
        }
      }
    }
    expect(pollinationChecks('san-pedro', false).breba.fruitExpected).toBe('yes');
  });
});
