// GS1 identifiers: GTIN check digits and SSCC construction.
// The mod-10 scheme is the same for every GS1 key (GS1 General Specifications §7.9.1),
// so GTIN-8/12/13/14 and SSCC-18 share one check-digit function.

const DIGITS = /^\d+$/;
const GTIN_LENGTHS = new Set([8, 12, 13, 14]);
const SSCC_LENGTH = 18;

/**
 * Check digit for a run of digits that does not yet carry one.
 * Weights alternate 3, 1, 3, 1 … starting from the rightmost digit.
 */
export function gs1CheckDigit(digitsWithoutCheck: string): number {
  if (!DIGITS.test(digitsWithoutCheck)) {
    throw new RangeError(`A GS1 key is digits only; got "${digitsWithoutCheck}".`);
  }
  let sum = 0;
  for (let i = 0; i < digitsWithoutCheck.length; i++) {
    const digit = digitsWithoutCheck.charCodeAt(digitsWithoutCheck.length - 1 - i) - 48;
    sum += digit * (i % 2 === 0 ? 3 : 1);
  }
  return (10 - (sum % 10)) % 10;
}

function hasValidCheckDigit(code: string): boolean {
  const body = code.slice(0, -1);
  return gs1CheckDigit(body) === Number(code[code.length - 1]);
}

/** True for a GTIN-8, -12, -13 or -14 written as bare digits with a correct check digit. */
export function isValidGtin(code: string): boolean {
  if (typeof code !== 'string' || !DIGITS.test(code) || !GTIN_LENGTHS.has(code.length)) {
    return false;
  }
  return hasValidCheckDigit(code);
}

/**
 * The 14-digit form used in AI (01) and for storage, so the same item scanned as a
 * GTIN-13 or keyed as a GTIN-14 compares equal. Spaces inside the code (as printed
 * under barcodes and in price lists) are ignored. Returns null when the code is not a
 * valid GTIN.
 */
export function normalizeGtin14(code: string): string | null {
  if (typeof code !== 'string') return null;
  const compact = code.replace(/\s+/g, '');
  if (!isValidGtin(compact)) return null;
  return compact.padStart(14, '0');
}

/** True for an 18-digit SSCC with a correct check digit. */
export function isValidSscc(code: string): boolean {
  if (typeof code !== 'string' || code.length !== SSCC_LENGTH || !DIGITS.test(code)) {
    return false;
  }
  return hasValidCheckDigit(code);
}

export interface SsccParts {
  /** One digit the company uses to widen its serial range (often a packaging level). */
  extension: number | string;
  /** GS1 company prefix, 4–12 digits; a setting of the deployment. */
  companyPrefix: string;
  /** Serial reference; left-padded with zeros to fill the 17 data digits. */
  serialReference: number | string;
}

/** Build an SSCC-18: extension + company prefix + serial reference (17 digits) + check digit. */
export function makeSscc({ extension, companyPrefix, serialReference }: SsccParts): string {
  const ext = String(extension);
  if (!/^\d$/.test(ext)) {
    throw new RangeError(`The SSCC extension digit is one digit 0–9; got "${ext}".`);
  }
  if (!/^\d{4,12}$/.test(companyPrefix)) {
    throw new RangeError(`A GS1 company prefix is 4 to 12 digits; got "${companyPrefix}".`);
  }
  if (typeof serialReference === 'number' && !(Number.isSafeInteger(serialReference) && serialReference >= 0)) {
    throw new RangeError(`The serial reference must be a whole number ≥ 0; got ${serialReference}.`);
  }
  const serial = String(serialReference);
  const room = 16 - companyPrefix.length;
  if (!DIGITS.test(serial) || serial.length > room) {
    throw new RangeError(
      `With a ${companyPrefix.length}-digit company prefix the serial reference is up to ${room} digits; got "${serial}".`,
    );
  }
  const body = ext + companyPrefix + serial.padStart(room, '0');
  return body + String(gs1CheckDigit(body));
}
