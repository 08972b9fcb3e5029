/**
 * Rights statements as IIIF Presentation 3.0 takes them in `rights` (§3.3.2, rights): "The value
 * must be drawn from the set of Creative Commons license URIs, the RightsStatements.org rights
 * statement URIs, or those added via the extension mechanism", one string, and publishers should use
 * the http form of those URIs (the specification's discussion of `rights`; IIIF/api issue 2010 moved
 * the 3.0 example manifest from https to http://creativecommons.org/licenses/by/4.0/).
 *
 * Sources of the URI forms:
 * - RightsStatements.org: the twelve statements and their URIs are from the consortium's data model
 *   (rightsstatements/data-model, rights-statements.ttl: `@base <http://rightsstatements.org/vocab/>`,
 *   statements `<InC/1.0/>` … `<UND/1.0/>`). The human-readable page of a statement is
 *   http://rightsstatements.org/page/<code>/1.0/; it is read as the statement's URI.
 * - Creative Commons: the licence URIs http://creativecommons.org/licenses/<by|by-sa|…>/<version>/
 *   (with a jurisdiction folder for ported licences before 4.0, e.g. /licenses/by/3.0/de/), and the
 *   public-domain tools http://creativecommons.org/publicdomain/zero/1.0/ and
 *   http://creativecommons.org/publicdomain/mark/1.0/ — recalled from memory of creativecommons.org,
 *   not checked against a published list; the "by/4.0" form is the IIIF example's.
 * - The IIIF extensions registry: no other rights vocabulary registered there is known to this code
 *   (recalled from memory, not checked); a value from one would need a line in `canonicalRights`.
 *
 * The labels are the product's own plain wording.
 */

export type RightsGroup = 'creative_commons' | 'public_domain' | 'rightsstatements';

export interface RightsChoice {
  uri: string;
  /** Short form people know: "CC BY-NC 4.0", "InC-RUU". */
  code: string;
  label: string;
  group: RightsGroup;
}

const CC = 'http://creativecommons.org';
const RS = 'http://rightsstatements.org/vocab';

/** The six Creative Commons licence elements, with their plain names. */
const CC_ELEMENTS: Record<string, string> = {
  by: 'Attribution',
  'by-sa': 'Attribution-ShareAlike',
  'by-nd': 'Attribution-NoDerivatives',
  'by-nc': 'Attribution-NonCommercial',
  'by-nc-sa': 'Attribution-NonCommercial-ShareAlike',
  'by-nc-nd': 'Attribution-NonCommercial-NoDerivatives',
};

/** The twelve statements of rights-statements.ttl (version 1.0), with plain labels. */
const RS_STATEMENTS: Record<string, string> = {
  InC: 'In copyright',
  'InC-OW-EU': 'In copyright: EU orphan work',
  'InC-EDU': 'In copyright: educational use permitted',
  'InC-NC': 'In copyright: non-commercial use permitted',
  'InC-RUU': 'In copyright: rights-holder(s) unlocatable or unidentifiable',
  'NoC-CR': 'No copyright: contractual restrictions',
  'NoC-NC': 'No copyright: non-commercial use only',
  'NoC-OKLR': 'No copyright: other known legal restrictions',
  'NoC-US': 'No copyright: United States',
  CNE: 'Copyright not evaluated',
  UND: 'Copyright undetermined',
  NKC: 'No known copyright',
};

/** The choices the print form offers: the 4.0 licences, the two public-domain tools, every RightsStatements.org statement. */
export const RIGHTS_CHOICES: readonly RightsChoice[] = [
  ...Object.entries(CC_ELEMENTS).map(([el, name]) => ({
    uri: `${CC}/licenses/${el}/4.0/`, code: `CC ${el.toUpperCase()} 4.0`, label: `Creative Commons ${name} 4.0 (CC ${el.toUpperCase()} 4.0)`, group: 'creative_commons' as const,
  })),
  { uri: `${CC}/publicdomain/zero/1.0/`, code: 'CC0 1.0', label: 'Public domain dedication (CC0 1.0)', group: 'public_domain' },
  { uri: `${CC}/publicdomain/mark/1.0/`, code: 'PDM 1.0', label: 'Public domain, no known copyright (Public Domain Mark 1.0)', group: 'public_domain' },
  ...Object.entries(RS_STATEMENTS).map(([code, label]) => ({ uri: `${RS}/${code}/1.0/`, code, label, group: 'rightsstatements' as const })),
];

export const RIGHTS_GROUP_LABELS: Record<RightsGroup, string> = {
  creative_commons: 'Creative Commons licences',
  public_domain: 'Public domain',
  rightsstatements: 'RightsStatements.org statements',
};

/** What a person is told when a value is refused. */
export const RIGHTS_MESSAGE =
  'Give the address (URI) of a Creative Commons licence or a RightsStatements.org statement, such as http://rightsstatements.org/vocab/InC/1.0/';

const CC_VERSIONS = ['1.0', '2.0', '2.1', '2.5', '3.0', '4.0'];
const RS_CODES = new Map(Object.keys(RS_STATEMENTS).map((c) => [c.toLowerCase(), c]));

/**
 * The canonical URI of a rights statement, or null when the text is not one IIIF takes: http, no
 * `www.`, a closing slash, no deed or legal-code page, a statement's page read as its vocabulary URI.
 * https://creativecommons.org/licenses/by-nc/4.0/deed.en → http://creativecommons.org/licenses/by-nc/4.0/.
 */
export function canonicalRights(text: string | null | undefined): string | null {
  const value = text?.trim();
  if (!value) return null;
  let url: URL;
  try {
    url = new URL(value);
  } catch {
    return null;
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') return null;
  if (url.username || url.password || url.port) return null;
  const host = url.hostname.toLowerCase().replace(/^www\./, '');
  const parts = url.pathname.split('/').filter(Boolean);
  if (host === 'creativecommons.org') {
    // A licence's human-readable deed or its legal code are pages of the licence, not other licences.
    if (parts.length && /^(deed|legalcode)(\.[a-z-]+)?$/i.test(parts[parts.length - 1])) parts.pop();
    const [kind, el, version, jurisdiction, ...rest] = parts.map((p) => p.toLowerCase());
    if (kind === 'publicdomain') {
      return (el === 'zero' || el === 'mark') && version === '1.0' && !jurisdiction ? `${CC}/publicdomain/${el}/1.0/` : null;
    }
    if (kind !== 'licenses' || !el || !(el in CC_ELEMENTS) || !CC_VERSIONS.includes(version ?? '') || rest.length) return null;
    if (jurisdiction !== undefined && (version === '4.0' || !/^[a-z]{2,3}$/.test(jurisdiction))) return null;
    return `${CC}/licenses/${el}/${version}/${jurisdiction ? `${jurisdiction}/` : ''}`;
  }
  if (host === 'rightsstatements.org') {
    const [kind, code, version, ...rest] = parts;
    const known = RS_CODES.get((code ?? '').toLowerCase());
    if ((kind !== 'vocab' && kind !== 'page') || !known || version !== '1.0' || rest.length) return null;
    return `${RS}/${known}/1.0/`;
  }
  return null;
}

/** A rights URI as people read it: the choice's label, or for another Creative Commons licence "CC BY-SA 3.0 (de)". */
export function rightsLabel(uri: string | null | undefined): string | null {
  const canonical = canonicalRights(uri);
  if (!canonical) return uri?.trim() || null;
  const choice = RIGHTS_CHOICES.find((c) => c.uri === canonical);
  if (choice) return choice.label;
  const [, el, version, jurisdiction] = new URL(canonical).pathname.split('/').filter(Boolean);
  return `Creative Commons ${CC_ELEMENTS[el]} ${version}${jurisdiction ? ` (${jurisdiction})` : ''} (CC ${el.toUpperCase()} ${version})`;
}
