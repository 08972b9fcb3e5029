import type { PrintSection } from '../section';

export const loanObjects: PrintSection = {
  key: 'loans', table: 'loan_objects', parentColumn: 'print_id', orderBy: 't.loan_id',
  description: 'The print on a loan (the loan itself is in data/records/loans.jsonl): its place on the loan and where it returns.',
};
