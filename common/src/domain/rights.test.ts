import { describe, expect, it } from 'vitest';
import { canonicalRights, RIGHTS_CHOICES, rightsLabel } from './rights';
import { printInputSchema } from '../schemas/catalogue';
import { printField } from '../fields/print';

/**
 * Rights URIs checked against outside sources:
 * - RightsStatements.org: the statements of the consortium's data model (rightsstatements/data-model,
 *   rights-statements.ttl, `@base <http://rightsstatements.org/vocab/>`), which lists exactly these
 *   twelve `<code/1.0/>` resources in its three collections (in copyright: InC, InC-OW-EU, InC-RUU,
 *   InC-EDU, InC-NC; not in copyright: NoC-NC, NoC-CR, NoC-OKLR, NoC-US; other: NKC, CNE, UND).
 * - IIIF Presentation 3.0 §3.3.2 `rights`: the 3.0 example manifest's value
 *   http://creativecommons.org/licenses/by/4.0/ (http, after IIIF/api issue 2010).
 * - Creative Commons licence and public-domain tool URIs: recalled from memory of creativecommons.org.
 */
const TTL_STATEMENTS = ['InC', 'InC-OW-EU', 'InC-RUU', 'InC-EDU', 'InC-NC', 'NoC-NC', 'NoC-CR', 'NoC-OKLR', 'NoC-US', 'NKC', 'CNE', 'UND'];

describe('rights statement URIs', () => {
  it('offers every RightsStatements.org statement of the data model, each under its vocabulary URI, and nothing else from that site', () => {
    const offered = RIGHTS_CHOICES.filter((c) => c.group === 'rightsstatements').map((c) => c.uri).sort();
    expect(offered).toEqual(TTL_STATEMENTS.map((code) => `http://rightsstatements.org/vocab/${code}/1.0/`).sort());
  });

  it('offers the six 4.0 licences and the two public-domain tools (recalled from memory), each already canonical', () => {
    const cc = RIGHTS_CHOICES.filter((c) => c.group !== 'rightsstatements').map((c) => c.uri);
    expect(cc).toEqual([
      'http://creativecommons.org/licenses/by/4.0/', 'http://creativecommons.org/licenses/by-sa/4.0/', 'http://creativecommons.org/licenses/by-nd/4.0/',
      'http://creativecommons.org/licenses/by-nc/4.0/', 'http://creativecommons.org/licenses/by-nc-sa/4.0/', 'http://creativecommons.org/licenses/by-nc-nd/4.0/',
      'http://creativecommons.org/publicdomain/zero/1.0/', 'http://creativecommons.org/publicdomain/mark/1.0/',
    ]);
    for (const c of RIGHTS_CHOICES) expect(canonicalRights(c.uri), c.uri).toBe(c.uri);
    expect(new Set(RIGHTS_CHOICES.map((c) => c.label)).size).toBe(RIGHTS_CHOICES.length);
  });

  it.each([
    ['https://creativecommons.org/licenses/by/4.0/', 'http://creativecommons.org/licenses/by/4.0/'],
    ['http://www.creativecommons.org/licenses/by-nc-nd/4.0', 'http://creativecommons.org/licenses/by-nc-nd/4.0/'],
    ['https://creativecommons.org/licenses/by-sa/4.0/legalcode.en', 'http://creativecommons.org/licenses/by-sa/4.0/'],
    ['https://creativecommons.org/licenses/by/3.0/de/deed.de', 'http://creativecommons.org/licenses/by/3.0/de/'],
    ['https://creativecommons.org/publicdomain/zero/1.0/deed.en', 'http://creativecommons.org/publicdomain/zero/1.0/'],
    ['  http://rightsstatements.org/vocab/InC/1.0/  ', 'http://rightsstatements.org/vocab/InC/1.0/'],
    ['https://rightsstatements.org/page/NoC-US/1.0/?language=en', 'http://rightsstatements.org/vocab/NoC-US/1.0/'],
    ['http://rightsstatements.org/vocab/inc-ruu/1.0', 'http://rightsstatements.org/vocab/InC-RUU/1.0/'],
  ])('reads %s as %s', (input, canonical) => {
    expect(canonicalRights(input)).toBe(canonical);
  });

  it.each([
    'All rights reserved', 'http://example.org/licenses/by/4.0/', 'ftp://creativecommons.org/licenses/by/4.0/',
    'http://creativecommons.org/licenses/by/5.0/', 'http://creativecommons.org/licenses/by/4.0/de/', 'http://creativecommons.org/licenses/nc/4.0/',
    'http://creativecommons.org/publicdomain/zero/2.0/', 'http://rightsstatements.org/vocab/InC-RUW/1.0/', 'http://rightsstatements.org/vocab/InC/1.0/extra/',
    'http://creativecommons.org.example.net/licenses/by/4.0/', 'http://user@rightsstatements.org/vocab/InC/1.0/',
  ])('refuses %s', (input) => {
    expect(canonicalRights(input)).toBeNull();
  });

  it('labels a listed URI by its choice and another Creative Commons licence by its parts', () => {
    expect(rightsLabel('http://rightsstatements.org/vocab/UND/1.0/')).toBe('Copyright undetermined');
    expect(rightsLabel('https://creativecommons.org/licenses/by-sa/3.0/de/')).toBe('Creative Commons Attribution-ShareAlike 3.0 (de) (CC BY-SA 3.0)');
  });
});

describe('the print field `rights`', () => {
  it('is one field of the table, its CSV column `rights`, read by every catalogue reader', () => {
    expect(printField('rights')).toMatchObject({ key: 'rights', inputKey: 'rights', column: 'rights', read: 'catalogue.read', origin: 'entered', type: { kind: 'rights' } });
  });

  it('the contract keeps the canonical URI, takes empty as none, and refuses anything else naming the field', () => {
    const base = { accessionNumber: '2001.1.1', title: 'Net lofts', process: 'cyanotype' };
    expect(printInputSchema.parse({ ...base, rights: 'https://creativecommons.org/licenses/by-nc/4.0/deed.en' }).rights).toBe('http://creativecommons.org/licenses/by-nc/4.0/');
    expect(printInputSchema.parse({ ...base, rights: '  ' }).rights).toBeNull();
    expect(printInputSchema.parse(base).rights).toBeUndefined();
    const refused = printInputSchema.safeParse({ ...base, rights: 'Copyright the Trust' });
    expect(refused.success).toBe(false);
    expect(refused.error?.issues.map((i) => i.path.join('.'))).toEqual(['rights']);
    expect(refused.error?.issues[0].message).toMatch(/^Give the address \(URI\) of a Creative Commons licence or a RightsStatements\.org statement/);
  });
});
