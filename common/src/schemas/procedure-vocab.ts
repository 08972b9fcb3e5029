/** Controlled lists of the procedure records (object entry, acquisition, treatment, deaccession). */
function labelled<const T extends readonly string[]>(codes: T, labels: Record<T[number], string>) {
  return { codes, labels, options: codes.map((c) => ({ value: c, label: labels[c as T[number]] })) };
}

export const ENTRY_REASON = labelled(['possible_acquisition', 'loan_in', 'enquiry'] as const, {
  possible_acquisition: 'Possible acquisition', loan_in: 'Loan in', enquiry: 'Enquiry',
});
export const ACQUISITION_METHOD = labelled(['gift', 'purchase', 'bequest', 'transfer'] as const, {
  gift: 'Gift', purchase: 'Purchase', bequest: 'Bequest', transfer: 'Transfer',
});
export const DEACCESSION_METHOD = labelled(['transfer', 'return', 'destruction'] as const, {
  transfer: 'Transfer to another collection', return: 'Return to owner', destruction: 'Destruction after damage',
});
export const DEACCESSION_STATUS = labelled(['proposed', 'approved', 'completed', 'withdrawn'] as const, {
  proposed: 'Proposed', approved: 'Approved', completed: 'Completed', withdrawn: 'Proposal withdrawn',
});
export const TREATMENT_STATUS = labelled(['proposed', 'approved', 'done', 'signed'] as const, {
  proposed: 'Proposed', approved: 'Approved', done: 'Treatment done', signed: 'Signed',
});
export const TREATMENT_IMAGE_STAGE = labelled(['before', 'during', 'after'] as const, {
  before: 'Before', during: 'During', after: 'After',
});
export const TREATMENT_MATERIAL_KIND = labelled(['material', 'solvent'] as const, {
  material: 'Material', solvent: 'Solvent',
});
