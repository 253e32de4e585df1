/**
 * Reads one spreadsheet cell as a number, accepting a decimal point or a decimal comma.
 * A cell that could mean two different numbers is refused, never guessed:
 * "1,234" is 1.234 with a decimal comma and 1234 with a thousands separator.
 */
export type NumberReading = { value: number } | { error: string } | { empty: true };

const plain = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;
const decimalComma = /^[+-]?\d*,\d+$/;
const groupedPoint = /^[+-]?\d{1,3}(,\d{3})+\.\d+$/; // 1,234.5
const groupedComma = /^[+-]?\d{1,3}(\.\d{3})+,\d+$/; // 1.234,5

export function readNumber(cell: string): NumberReading {
  const text = cell.trim().replace(/\u00a0/g, ' ');
  if (text === '') return { empty: true };
  if (plain.test(text)) return { value: Number(text) };
  if (decimalComma.test(text)) {
    const decimals = text.split(',')[1];
    const whole = text.split(',')[0].replace(/^[+-]/, '');
    if (decimals.length === 3 && whole !== '' && whole !== '0')
      return { error: `“${text}” is ambiguous: ${text.replace(',', '.')} with a decimal comma, or ${text.replace(',', '')} with a thousands separator. Write it with a decimal point.` };
    return { value: Number(text.replace(',', '.')) };
  }
  if (groupedPoint.test(text)) return { value: Number(text.replace(/,/g, '')) };
  if (groupedComma.test(text)) return { value: Number(text.replace(/\./g, '').replace(',', '.')) };
  return { error: `“${text}” is not a number.` };
}
