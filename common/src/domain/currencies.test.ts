import { describe, expect, it } from 'vitest';
import { CURRENCIES, CURRENCY_CODES, currencyOf } from './currencies';

describe('valuation currencies (ISO 4217)', () => {
  it('lists the currencies in use by code, with their names', () => {
    expect(currencyOf('GBP')).toEqual({ code: 'GBP', name: 'Pound Sterling' });
    expect(currencyOf('EUR')?.name).toBe('Euro');
    expect(currencyOf('XOF')?.name).toBe('CFA Franc BCEAO');
    expect(CURRENCY_CODES).toEqual([...CURRENCY_CODES].sort());
    expect(new Set(CURRENCY_CODES).size).toBe(CURRENCIES.length);
    for (const c of CURRENCIES) expect(c.code).toMatch(/^[A-Z]{3}$/);
  });

  it('leaves out what is not money: no currency, the testing code, precious metals, bond-market units', () => {
    for (const code of ['XXX', 'XTS', 'XAU', 'XAG', 'XPT', 'XPD', 'XBA', 'XBD']) expect(currencyOf(code), code).toBeUndefined();
  });

  it('knows no made-up or lower-case code', () => {
    expect(currencyOf('POU')).toBeUndefined();
    expect(currencyOf('gbp')).toBeUndefined();
  });
});
