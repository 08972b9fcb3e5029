import iso4217 from 'currency-codes';

/**
 * Currencies a valuation may be given in: ISO 4217 List One as published by its maintenance agency
 * (the `currency-codes` package carries the list and its publication date), less the entries that
 * ISO itself assigns to no country (entity "ZZ": gold, silver, platinum, palladium, the bond-market
 * units, the testing code XTS and XXX, "no currency involved"), since none of them is money a print
 * can be valued in.
 */
const NOT_MONEY = /^zz\d/i;

export interface Currency {
  code: string;
  name: string;
}

/** Every valuation currency, by code (A–Z), with its ISO 4217 name. */
export const CURRENCIES: readonly Currency[] = iso4217.data
  .filter((c) => !c.countries.some((country) => NOT_MONEY.test(country)))
  .map((c) => ({ code: c.code, name: c.currency }))
  .sort((a, b) => a.code.localeCompare(b.code));

/** The date of the ISO 4217 list the codes come from. */
export const CURRENCY_LIST_DATE: string = iso4217.publishDate;

const BY_CODE = new Map(CURRENCIES.map((c) => [c.code, c]));

/** The codes, as the contract's enum takes them. */
export const CURRENCY_CODES = CURRENCIES.map((c) => c.code) as [string, ...string[]];

/** A valuation currency by its code (exactly as listed: three capital letters). */
export function currencyOf(code: string): Currency | undefined {
  return BY_CODE.get(code);
}
