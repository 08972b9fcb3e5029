/**
 * Controlled lists of the catalogue. Codes are stable (stored and exported); labels are for people.
 * Terms follow the trade's usage for photographic prints.
 */
function labelled<const T extends readonly string[]>(codes: T, labels: Record<T[number], string>) {
  return { codes, labels, options: codes.map((c) => ({ value: c, label: labels[c as T[number]] })) };
}

export const PROCESS = labelled(
  ['gelatin_silver_developing_out', 'gelatin_silver_printing_out', 'cyanotype', 'albumen', 'platinum_palladium', 'other'] as const,
  {
    gelatin_silver_developing_out: 'Gelatin silver, developing-out',
    gelatin_silver_printing_out: 'Gelatin silver, printing-out',
    cyanotype: 'Cyanotype',
    albumen: 'Albumen',
    platinum_palladium: 'Platinum / palladium',
    other: 'Other',
  },
);

export const SUPPORT = labelled(['fibre_baryta', 'resin_coated', 'other'] as const, {
  fibre_baryta: 'Fibre-based (baryta)',
  resin_coated: 'Resin-coated',
  other: 'Other',
});

export const STATUS = labelled(['in_store', 'on_display', 'on_loan', 'in_treatment', 'deaccessioned'] as const, {
  in_store: 'In store',
  on_display: 'On display',
  on_loan: 'On loan',
  in_treatment: 'In treatment',
  deaccessioned: 'Deaccessioned',
});

/** Light responsivity categories of CIE 157:2004 (by ISO Blue Wool responsivity). */
export const LIGHT_RESPONSIVITY = labelled(['irresponsive', 'low', 'medium', 'high'] as const, {
  irresponsive: 'Irresponsive',
  low: 'Low (Blue Wool 7 and above)',
  medium: 'Medium (Blue Wool 4–6)',
  high: 'High (Blue Wool 1–3)',
});

export const TONER_CLASS = labelled(['selenium', 'gold', 'sulfide', 'polysulfide', 'iron_blue', 'copper', 'vanadium', 'other'] as const, {
  selenium: 'Selenium',
  gold: 'Gold',
  sulfide: 'Sulfide (sepia)',
  polysulfide: 'Polysulfide',
  iron_blue: 'Iron blue (Prussian blue)',
  copper: 'Copper',
  vanadium: 'Vanadium',
  other: 'Other',
});

export const STEP_TYPE = labelled(
  ['development', 'stop', 'fixing', 'washing', 'hypo_clearing', 'toning', 'after_bath', 'final_wash', 'residual_thiosulfate_test'] as const,
  {
    development: 'Development',
    stop: 'Stop bath',
    fixing: 'Fixing',
    washing: 'Washing',
    hypo_clearing: 'Hypo clearing',
    toning: 'Toning',
    after_bath: 'After-bath',
    final_wash: 'Final wash',
    residual_thiosulfate_test: 'Residual-thiosulfate test',
  },
);

/** How far a toning went. A split effect is not an extent: it is written in the step's notes ("Split effect."). */
export const TONING_EXTENT = labelled(['full', 'partial', 'local'] as const, {
  full: 'Full',
  partial: 'Partial',
  local: 'Local',
});

/** Test methods of ISO 18917, and an informal spot test. No pass/fail limit is stored or implied. */
export const THIOSULFATE_METHOD = labelled(
  ['iso18917_methylene_blue', 'iso18917_silver_sulfide', 'iso18917_iodine_amylose', 'spot_test'] as const,
  {
    iso18917_methylene_blue: 'ISO 18917 methylene blue',
    iso18917_silver_sulfide: 'ISO 18917 silver sulfide densitometric',
    iso18917_iodine_amylose: 'ISO 18917 iodine–amylose',
    spot_test: 'Spot test',
  },
);

export const PAPER_BASE = labelled(['fibre', 'rc', 'other'] as const, { fibre: 'Fibre', rc: 'Resin-coated', other: 'Other' });

export const YES_NO_UNKNOWN = labelled(['yes', 'no', 'unknown'] as const, { yes: 'Yes', no: 'No', unknown: 'Unknown' });

export const LOCATION_KIND = labelled(['building', 'room', 'cabinet', 'shelf', 'drawer', 'box', 'other'] as const, {
  building: 'Building',
  room: 'Room',
  cabinet: 'Cabinet',
  shelf: 'Shelf',
  drawer: 'Drawer',
  box: 'Box',
  other: 'Other',
});

/** Photographic Activity Test (ISO 18916), the test that ISO 18902 asks enclosure materials to pass. */
export const PAT_RESULT = labelled(['passed', 'failed', 'not_tested'] as const, {
  passed: 'Passed',
  failed: 'Failed',
  not_tested: 'Not tested',
});

export const INGREDIENT_UNIT = labelled(['g', 'mg', 'kg', 'ml', 'l'] as const, { g: 'g', mg: 'mg', kg: 'kg', ml: 'ml', l: 'l' });
