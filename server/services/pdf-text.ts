/**
 * The report's text faces (PDF standard Helvetica) encode only Windows-1252 ("WinAnsi"). Formulas and
 * sources use Greek letters and math signs, so those are spelled out rather than printed as garbage.
 */

/** The characters of Windows-1252 beyond Latin-1 (0x80–0x9F). */
const CP1252_EXTRA = new Set('€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ');

const SPELLED: Record<string, string> = {
  α: 'alpha',
  β: 'beta',
  γ: 'gamma',
  δ: 'delta',
  Δ: 'Delta',
  ε: 'epsilon',
  θ: 'theta',
  λ: 'lambda',
  μ: 'µ',
  ν: 'nu',
  π: 'pi',
  ρ: 'rho',
  σ: 'sigma',
  Σ: 'Sum',
  τ: 'tau',
  φ: 'phi',
  ϕ: 'phi',
  ω: 'omega',
  '≤': '<=',
  '≥': '>=',
  '≈': '~',
  '≠': '!=',
  '√': 'sqrt',
  '→': '->',
  '⇒': '=>',
  '⇔': '<=>',
  '←': '<-',
  '∞': 'inf',
  '−': '-',
  '∙': '·',
  '⋅': '·',
  '×': '×',
  '′': "'",
  '″': '"',
  '\u2009': ' ',
  '\u202f': ' ',
  '₀': '0',
  '₁': '1',
  '₂': '2',
  '₃': '3',
  '₄': '4',
  '₅': '5',
  '₆': '6',
  '₇': '7',
  '₈': '8',
  '₉': '9',
  '⁰': '^0',
  '⁴': '^4',
  '⁵': '^5',
  '⁶': '^6',
  '⁷': '^7',
  '⁸': '^8',
  '⁹': '^9',
  '⁻': '^-',
  ⁿ: '^n',
};

const encodable = (ch: string) => {
  const code = ch.codePointAt(0)!;
  return (code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff) || ch === '\n' || CP1252_EXTRA.has(ch);
};

/** The text with every character Helvetica cannot show spelled out (Greek, math signs) or, failing that, as '?'. */
export function toWinAnsi(text: string): string {
  let out = '';
  for (const ch of text) out += encodable(ch) ? ch : (SPELLED[ch] ?? '?');
  return out;
}
