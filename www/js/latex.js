// LaTeX written from the page's MathML: one tree (the <math> element mathml.js builds), two
// writers — the browser renders the tree as MathML, toLatex writes the same tree as LaTeX. Nothing
// is parsed from text here. Also the "Copy LaTeX" button every typeset formula carries.
// The writer reads only localName, childNodes, nodeType and textContent (and getAttribute for
// mspace), so node tests can hand it plain objects of that shape (tests/e2e/latex.test.mjs).
import { copyText } from './dom.js';

/** Characters with a LaTeX command of their own (operators, letters, symbols). */
const LATEX_SYMBOLS = {
  '−': '-', '×': '\\times', '·': '\\cdot', '⋅': '\\cdot', '∞': '\\infty', '∫': '\\int', '∑': '\\sum', '⋯': '\\cdots', '…': '\\ldots',
  '≠': '\\neq', '≤': '\\le', '≥': '\\ge', '∈': '\\in', '→': '\\to', '±': '\\pm', '∓': '\\mp', '≈': '\\approx',
  'ℝ': '\\mathbb{R}', 'ℂ': '\\mathbb{C}', 'ℤ': '\\mathbb{Z}', 'ℕ': '\\mathbb{N}',
  'α': '\\alpha', 'β': '\\beta', 'γ': '\\gamma', 'Γ': '\\Gamma', 'δ': '\\delta', 'ε': '\\varepsilon', 'ζ': '\\zeta', 'η': '\\eta',
  'θ': '\\theta', 'κ': '\\kappa', 'λ': '\\lambda', 'μ': '\\mu', 'ν': '\\nu', 'ξ': '\\xi', 'π': '\\pi', 'ρ': '\\rho', 'σ': '\\sigma',
  'τ': '\\tau', 'φ': '\\varphi', 'χ': '\\chi', 'ψ': '\\psi', 'ω': '\\omega', 'Ω': '\\Omega', 'Δ': '\\Delta', 'Φ': '\\Phi',
  '{': '\\{', '}': '\\}', '%': '\\%', '#': '\\#', '&': '\\&', '_': '\\_',
  '\u2062': ' ', // invisible times
  '\u2061': '', // function application
  '\u2063': ',', // invisible separator
  '′': "'", '″': "''",
};
/** Names set upright: the standard ones have a command, the others go through \operatorname. */
const LATEX_NAMED = new Set(['sin', 'cos', 'tan', 'exp', 'log', 'ln', 'sinh', 'cosh', 'tanh', 'arg', 'det', 'max', 'min', 'lim']);
const LATEX_OPERATORS = new Set(['Res', 'Re', 'Im', 'PV', 'sgn', 'erf', 'erfc']);

function latexSymbols(text) {
  let out = '';
  for (const ch of text) {
    const r = ch in LATEX_SYMBOLS ? LATEX_SYMBOLS[ch] : ch;
    out += /\\[a-zA-Z]+$/.test(r) ? r + ' ' : r; // a command word ends with a space
  }
  return out;
}

function latexChildren(node) {
  return Array.from(node.childNodes || []).filter((c) => c.nodeType === 1 || (c.nodeType === 3 && c.textContent.trim() !== ''));
}

/** A group for a sub- or superscript: braces unless it is one character. */
function latexBraced(s) {
  const t = s.trim();
  return t.length === 1 ? t : `{${t}}`;
}

function latexTag(node) {
  return String(node.localName || node.tagName || '').toLowerCase().replace(/^m:/, '');
}

/** The tree under `node` (a MathML element, or an object of the same shape) as LaTeX. */
export function toLatex(node) {
  const out = latexWrite(node).replace(/\s+/g, ' ').replace(/ ([,)\]}^_])/g, '$1').replace(/([({[]) /g, '$1')
    .replace(/(^|[({[]) ?- /g, '$1-') // a leading minus sign, not a binary one
    .replace(/= - /g, '= -')
    .replace(/(\\[a-zA-Z]+|\\operatorname\{[^}]*\}) ([([])/g, '$1$2').trim();
  return out;
}

function latexWrite(node) {
  if (node.nodeType === 3) return latexSymbols(node.textContent);
  const kids = latexChildren(node);
  const all = () => kids.map(latexWrite).join('');
  switch (latexTag(node)) {
    case 'math': case 'mrow': case 'mstyle': case 'mpadded': case 'semantics':
      return all();
    case 'annotation': case 'annotation-xml':
      return '';
    case 'mi': {
      const t = node.textContent.trim();
      const primed = /^(.)([′″']+)$/u.exec(t); // δ′, f″: the letter, then its primes
      if (primed) return latexSymbols(primed[1]).trim() + primed[2].replace(/″/g, "''").replace(/′/g, "'");
      if (LATEX_NAMED.has(t)) return `\\${t} `;
      if (LATEX_OPERATORS.has(t)) return `\\operatorname{${t}} `;
      if ([...t].length > 1) return `\\mathrm{${latexSymbols(t)}}`;
      return latexSymbols(t);
    }
    case 'mn':
      return latexSymbols(node.textContent.trim());
    case 'mo': {
      const t = node.textContent.trim() || node.textContent;
      if (t === '\u2062') return ' ';
      if (t === '\u2061') return '';
      if (t === ',') return ', ';
      const s = latexSymbols(t);
      return /^[-+=<>]$/.test(s) ? ` ${s} ` : s;
    }
    case 'mtext': {
      const t = node.textContent;
      if (LATEX_OPERATORS.has(t.trim())) return `\\operatorname{${t.trim()}} `;
      // a number written as text (a value with its digits): keep it as math
      if (/^[\s\d.,−+\-eE×·i()]*$/.test(t)) return latexSymbols(t);
      return `\\text{${t.replace(/[\\{}]/g, (c) => '\\' + c)}}`;
    }
    case 'mspace':
      return '\\quad ';
    case 'mfrac':
      return `\\frac{${latexWrite(kids[0]).trim()}}{${latexWrite(kids[1]).trim()}}`;
    case 'msqrt':
      return `\\sqrt{${all().trim()}}`;
    case 'msup':
      return `${latexWrite(kids[0]).trim()}^${latexBraced(latexWrite(kids[1]))}`;
    case 'msub':
      return `${latexWrite(kids[0]).trim()}_${latexBraced(latexWrite(kids[1]))}`;
    case 'msubsup':
      return `${latexWrite(kids[0]).trim()}_${latexBraced(latexWrite(kids[1]))}^${latexBraced(latexWrite(kids[2]))}`;
    case 'munderover':
      return `${latexWrite(kids[0]).trim()}_${latexBraced(latexWrite(kids[1]))}^${latexBraced(latexWrite(kids[2]))}`;
    case 'munder':
      return `${latexWrite(kids[0]).trim()}_${latexBraced(latexWrite(kids[1]))}`;
    case 'mover':
      return `${latexWrite(kids[0]).trim()}^${latexBraced(latexWrite(kids[1]))}`;
    default:
      return all();
  }
}


/** Put the LaTeX of `math` on it (`data-latex`) and return a "Copy LaTeX" button for it
 *  (`label`: what the formula is, for screen readers). The button says "Copied" for a moment. */
export function latexButton(math, label = 'the formula') {
  const latex = toLatex(math);
  math.setAttribute('data-latex', latex);
  const button = document.createElement('button');
  button.type = 'button';
  button.className = 'small copy-latex';
  button.textContent = 'Copy LaTeX';
  button.setAttribute('aria-label', `Copy ${label} as LaTeX`);
  button.dataset.latex = latex;
  button.addEventListener('click', async () => {
    const ok = await copyText(latex);
    button.textContent = ok ? 'Copied' : 'Copy failed: select the text';
    setTimeout(() => { button.textContent = 'Copy LaTeX'; }, 1500);
  });
  return button;
}
