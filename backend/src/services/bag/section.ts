/**
 * What the bag holds, table by table. A print's file (`data/prints/<accession>.json`) is its row and
 * one array per section; each section is the rows of one table that name the print, each row with
 * its own rows nested (a condition report with its observations and addenda). A section is a small
 * file in `sections/`, listed in `sections/index.ts` in the order an import writes them (a table
 * after the tables it refers to).
 */
export interface BagTable {
  /** Key of the array in the print's file (camelCase), or of the nested array in its parent's row. */
  key: string;
  /** The table the rows are read from and written back to. */
  table: string;
  /** The column naming the parent: the print (for a section) or the parent row (for nested rows). */
  parentColumn: string;
  /** The parent's column it matches (the primary key `id` unless named). */
  parentKey?: string;
  /** Only the rows this SQL condition over alias `t` keeps (when a table's rows have two kinds of parent). */
  where?: string;
  /** Order of the rows in the file (and of their insertion): SQL over the table's alias `t`. */
  orderBy: string;
  /** What the rows are, for the data dictionary. */
  description: string;
  /**
   * Columns an import writes only once the whole batch is in, because they refer to rows that refer
   * back (a spot's baseline names one of its own readings).
   */
  writeAfter?: string[];
  /** Rows nested inside each row, written after it. */
  children?: BagTable[];
}

export type PrintSection = BagTable;

/** Every table of a section, parents before their children (the order an import writes them). */
export function tablesOf(section: BagTable): BagTable[] {
  return [section, ...(section.children ?? []).flatMap(tablesOf)];
}
