//! Number cells: decimal marks, thousands separators, signs, scientific notation, and the
//! currency symbols and units people leave in cells.
//!
//! Kept apart from: the choice of decimal mark for a whole file (that is [`super::mark`], fed by
//! every value cell) and from what the numbers mean. A cell is read under one decimal mark; the
//! other mark, spaces (also U+00A0, U+202F, U+2009) and the apostrophe are thousands separators,
//! and groups must be well formed (1–3 digits not starting with 0, then groups of exactly 3),
//! so "0,500" under a dot mark is an error rather than 500, and "12,5" under a dot
//! mark is an error rather than 125.
//!
//! Stripped forms (one prefix and/or one suffix, with or without a space):
//! - prefixes: `$ € £ ¥ ₹ ₩ ₽ ₺ ₪ ₫ ₦ ₱ ฿ US$ A$ C$ NZ$ HK$ S$ R$` and the ISO codes in
//!   [`CODES`] (written in capitals);
//! - suffixes: the same symbols and codes, `kr zł Kč Ft %`, and the units in [`UNITS`]
//!   (case-insensitive; one-letter units `g t l L m u` only as written, so "1.2M" is an error,
//!   not a million or a metre). Anything else after a number is an error: "12x" is not 12.
//!
//! Signs: a leading `-`, `+` or `−` (U+2212), before or after a currency prefix, and accounting
//! parentheses: "(12)" is −12. Multipliers such as "k" or "M" and lakh grouping ("1,00,000") are
//! not read: such cells are errors the user can fix.
//!
//! Scientific notation, as spreadsheets write large or small numbers: a mantissa without
//! thousands separators, written with the file's decimal mark, then `e` or `E`, an optional sign
//! and digits, right after the mantissa: `1e5`, `1.5E+03`, and `2,5e3` in a decimal-comma file.
//!
//! Refused, each as an error at its cell: `inf`, `infinity`, `nan` and `∞` (any case and sign),
//! which formulas leave behind and which are never a quantity; and any value whose size is above
//! [`MAX_MAGNITUDE`], the series' own bound [`crate::series::MAX_ABS_VALUE`] (10^15), so that
//! intake refuses at its cell what a series would refuse later. Why that bound: no sales
//! quantity comes near it, f64 still holds every whole number up to it exactly (up to 2^53 ≈
//! 9.0 × 10^15), and squares and sums of thousands of such values (errors, MSE, smoothing
//! states) stay far below f64's limit of about 1.8 × 10^308, so nothing downstream overflows
//! into a missing measure. Such cells still count as numbers when intake decides the layout, so
//! one of them never turns a column of quantities into item names.

use super::DecimalMark;
use crate::sorting;

/// A number read from a cell, with the currency symbol or unit removed from it, if any.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Number {
    pub value: f64,
    pub affix: Option<String>,
}

/// Why a cell is not a number. [`NumberError::message`] says what to write instead.
#[derive(Clone, Debug, PartialEq)]
pub(crate) enum NumberError {
    /// No digits, or characters that belong to no number.
    NotANumber,
    /// Digits are there, but the separators do not fit the file's decimal mark.
    Grouping,
    /// A number followed by a word that is not a known unit or currency.
    UnknownUnit(String),
    /// A size above [`MAX_MAGNITUDE`].
    TooLarge,
    /// An infinity or not-a-number word ("inf", "NaN").
    NotFinite,
    /// Only dashes ("-", "--", "–", "—"): a mark for nothing, or for unknown.
    Dash,
    /// A word for nothing ([`NONE_WORDS`]: "nil", "none").
    NoneWord(String),
    /// A number with its minus after it ("7-", as some accounting exports write a negative),
    /// with the number as it would be written with the minus first.
    TrailingMinus(String),
}

/// Words written for "nothing" in place of a quantity, compared without case.
const NONE_WORDS: [&str; 5] = ["nil", "none", "nothing", "zero", "no sales"];

/// Zero or unknown: what the user decides for a cell that marks no quantity.
const ZERO_OR_GAP: &str = "write 0 if nothing sold in this period, or leave the cell empty if \
     the quantity is not known (a gap)";

/// The largest size of a value intake reads: the series' bound (see the module doc for why
/// 10^15).
pub(crate) const MAX_MAGNITUDE: f64 = crate::series::MAX_ABS_VALUE;

impl NumberError {
    /// What was expected, in words, for a file read with `mark`.
    pub fn message(&self, mark: DecimalMark) -> String {
        let example = match mark {
            DecimalMark::Dot => "12, 12.5 or 1,200.50",
            DecimalMark::Comma => "12, 12,5 or 1.200,50",
        };
        match self {
            NumberError::NotANumber => format!("expected a number such as {example}"),
            NumberError::Grouping => format!(
                "expected a number written with a {} decimal mark, as elsewhere in this file, \
                 such as {example}",
                mark.as_str()
            ),
            NumberError::UnknownUnit(unit) => format!(
                "expected a number such as {example}; \"{unit}\" is not a known unit or currency: \
                 remove it"
            ),
            NumberError::TooLarge => "expected a quantity of at most 10^15 \
                 (1,000,000,000,000,000) in size; no sales quantity is that large: check the cell \
                 for extra digits"
                .to_string(),
            NumberError::NotFinite => "expected a quantity; an infinity or \"not a number\" is \
                 none (a formula's error?): write the quantity, or leave the cell empty for a gap"
                .to_string(),
            NumberError::Dash => {
                format!("expected a number, not a dash: {ZERO_OR_GAP}")
            }
            NumberError::NoneWord(word) => {
                format!("expected a number; \"{word}\" is not one: {ZERO_OR_GAP}")
            }
            NumberError::TrailingMinus(negative) if negative == "0" => {
                "expected a number without a minus after it: write 0".to_string()
            }
            NumberError::TrailingMinus(negative) => format!(
                "expected a number with its minus sign first: write {negative} if this is a \
                 return or correction (a minus after the number, as some accounting exports \
                 write it, is not read)"
            ),
        }
    }
}

/// Three-letter currency codes stripped before or after a number.
pub(crate) const CODES: [&str; 24] = [
    "USD", "EUR", "GBP", "CHF", "JPY", "CAD", "AUD", "NZD", "SEK", "NOK", "DKK", "PLN", "CZK",
    "HUF", "INR", "ZAR", "BRL", "MXN", "CNY", "HKD", "SGD", "TRY", "RON", "ILS",
];

/// Currency symbols, longest first so that "US$" wins over "$".
const SYMBOLS: [&str; 22] = [
    "NZ$", "HK$", "US$", "A$", "C$", "S$", "R$", "$", "€", "£", "¥", "₹", "₩", "₽", "₺", "₪", "₫",
    "₦", "₱", "฿", "¢", "%",
];

/// Whether `text` holds a currency sign of [`SYMBOLS`] ("Sales (£)", "Takings ₹"): a header
/// naming money. A sign with digits after it is an amount within a name ("£5 gift card",
/// "Voucher $10": a product), not a column of money, unless the digits are a scale ("Sales
/// (£000)", "$1000s").
pub(crate) fn holds_currency_sign(text: &str) -> bool {
    SYMBOLS.iter().filter(|sym| **sym != "%").any(|sym| {
        text.match_indices(sym).any(|(at, _)| {
            let after = text[at + sym.len()..].trim_start();
            let digits: String = after
                .chars()
                .take_while(|c| c.is_ascii_digit() || *c == ',')
                .filter(char::is_ascii_digit)
                .collect();
            // "£000", "$1000s", "€ 1,000": a scale, so money; "£5", "$10": an amount in a name.
            let zeros = digits.strip_prefix('1').unwrap_or(&digits);
            let scale = zeros.len() >= 3 && zeros.chars().all(|c| c == '0');
            digits.is_empty() || scale
        })
    })
}

/// Currency words written after the amount.
const WORD_SUFFIXES: [&str; 4] = ["kr", "zł", "Kč", "Ft"];

/// Units of quantity stripped after a number, compared without case.
pub(crate) const UNITS: [&str; 33] = [
    "kg", "mg", "lb", "lbs", "oz", "ml", "cl", "m2", "m²", "m3", "m³", "cm", "mm", "km", "pcs",
    "pc", "pce", "units", "unit", "ea", "each", "box", "boxes", "case", "cases", "pack", "packs",
    "bag", "bags", "bottle", "bottles", "ltr", "pairs",
];

/// Whether an affix [`parse_number`] removed is a unit of quantity (not a currency or "%").
pub(crate) fn is_unit(affix: &str) -> bool {
    LETTER_UNITS.contains(&affix) || UNITS.iter().any(|u| u.eq_ignore_ascii_case(affix))
}

/// One-letter units, matched exactly as written.
const LETTER_UNITS: [&str; 6] = ["g", "t", "l", "L", "m", "u"];

/// Words for an infinity or a not-a-number, compared without case after an optional sign.
const NOT_FINITE: [&str; 4] = ["inf", "infinity", "nan", "\u{221e}"];

/// Whether a cell stands for "no value": empty, `NA`, `N/A`, `#N/A` or `null` (any case).
pub(crate) fn is_missing(cell: &str) -> bool {
    // ASCII comparison, no lowered copy per cell: no other letter lowers to these words'
    // letters (the Kelvin sign lowers to "k", which none of them holds).
    let t = cell.trim();
    ["", "na", "n/a", "#n/a", "null"]
        .iter()
        .any(|w| t.eq_ignore_ascii_case(w))
}

/// Reads `cell` as a number with decimal mark `mark`; the value is finite and at most
/// [`MAX_MAGNITUDE`] in size.
pub(crate) fn parse_number(cell: &str, mark: DecimalMark) -> Result<Number, NumberError> {
    let (_, word) = strip_sign(cell.trim());
    if NOT_FINITE.iter().any(|w| w.eq_ignore_ascii_case(word)) {
        return Err(NumberError::NotFinite);
    }
    let parts = split_affixes(cell).map_err(|e| refine(cell, mark, e))?;
    let magnitude =
        parse_core(parts.core, parts.exponent, mark).map_err(|e| refine(cell, mark, e))?;
    if !magnitude.is_finite() || magnitude > MAX_MAGNITUDE {
        return Err(NumberError::TooLarge);
    }
    let value = if parts.negative {
        -magnitude
    } else {
        magnitude
    };
    Ok(Number {
        value,
        affix: parts.affix,
    })
}

/// A cell that is no number, said more exactly where it is a dash, a word for nothing or a
/// number with its minus after it; `error` otherwise.
fn refine(cell: &str, mark: DecimalMark, error: NumberError) -> NumberError {
    if !matches!(error, NumberError::NotANumber | NumberError::UnknownUnit(_)) {
        return error;
    }
    let t = cell.trim();
    if !t.is_empty()
        && t.chars()
            .all(|c| matches!(c, '-' | '\u{2212}' | '\u{2013}' | '\u{2014}' | '\u{2012}'))
    {
        return NumberError::Dash;
    }
    if let Some(word) = NONE_WORDS.iter().find(|w| t.eq_ignore_ascii_case(w)) {
        return NumberError::NoneWord((*word).to_string());
    }
    let unsigned = t
        .strip_suffix('-')
        .or_else(|| t.strip_suffix('\u{2212}'))
        .map(str::trim_end);
    match unsigned {
        Some(number)
            if !number.is_empty()
                && number.chars().any(|c| c.is_ascii_digit())
                && !number.starts_with(['-', '\u{2212}'])
                // One minus after the number: more ("7--", or thousands of them) are no
                // number, and reading the rest again would recurse once per minus.
                && !number.ends_with(['-', '\u{2212}']) =>
        {
            // Written plainly, without grouping, in the file's decimal mark: "1,200-" in a
            // comma-separated file is "-1200", not a cell that splits in two.
            match parse_number(number, mark) {
                Ok(n) if n.value == 0.0 => NumberError::TrailingMinus("0".to_string()),
                Ok(n) => {
                    let plain = (-n.value).to_string();
                    NumberError::TrailingMinus(match mark {
                        DecimalMark::Dot => plain,
                        DecimalMark::Comma => plain.replace('.', ","),
                    })
                }
                Err(_) => error,
            }
        }
        _ => error,
    }
}

/// Whether the cell reads as a number under either decimal mark, or is one that intake refuses
/// (too large, or an infinity): those still count as numbers for the table's shape.
pub(crate) fn looks_number(cell: &str) -> bool {
    [DecimalMark::Dot, DecimalMark::Comma].iter().any(|mark| {
        matches!(
            parse_number(cell, *mark),
            Ok(_) | Err(NumberError::TooLarge | NumberError::NotFinite)
        )
    })
}

/// A cell split into sign, numeric core, exponent and the symbol or unit around it.
struct Parts<'a> {
    negative: bool,
    core: &'a str,
    /// The exponent's sign and digits ("+03", "5"), when the cell is in scientific notation.
    exponent: Option<&'a str>,
    affix: Option<String>,
}

fn is_group_space(c: char) -> bool {
    matches!(c, ' ' | '\u{a0}' | '\u{202f}' | '\u{2009}')
}

fn strip_sign(s: &str) -> (bool, &str) {
    for sign in ["-", "\u{2212}"] {
        if let Some(rest) = s.strip_prefix(sign) {
            return (true, rest.trim_start());
        }
    }
    match s.strip_prefix('+') {
        Some(rest) => (false, rest.trim_start()),
        None => (false, s),
    }
}

fn strip_prefix_symbol(s: &str) -> Option<(&'static str, &str)> {
    // No symbol or code starts with a digit: most cells are plain numbers, and trying every
    // prefix on each was a quarter of reading a 1,000-item file (measured with perf).
    if s.starts_with(|c: char| c.is_ascii_digit()) {
        return None;
    }
    SYMBOLS
        .iter()
        .chain(CODES.iter())
        .filter(|sym| **sym != "%")
        .find_map(|sym| s.strip_prefix(sym).map(|rest| (*sym, rest.trim_start())))
}

fn is_suffix(tail: &str) -> bool {
    SYMBOLS.contains(&tail)
        || CODES.contains(&tail)
        || WORD_SUFFIXES.contains(&tail)
        || LETTER_UNITS.contains(&tail)
        || UNITS
            .iter()
            .any(|u| u.eq_ignore_ascii_case(tail) || *u == tail)
}

fn split_affixes(cell: &str) -> Result<Parts<'_>, NumberError> {
    let mut s = cell.trim();
    let mut negative = false;
    if s.len() >= 2 && s.starts_with('(') && s.ends_with(')') {
        negative = true;
        s = s[1..s.len() - 1].trim();
    }
    let (sign, rest) = strip_sign(s);
    negative ^= sign;
    s = rest;
    let mut affix = None;
    if let Some((symbol, rest)) = strip_prefix_symbol(s) {
        affix = Some(symbol.to_string());
        let (sign, rest) = strip_sign(rest);
        negative ^= sign;
        s = rest;
    }
    let core_len = s
        .char_indices()
        .find(|(_, c)| !(c.is_ascii_digit() || matches!(c, '.' | ',' | '\'') || is_group_space(*c)))
        .map_or(s.len(), |(i, _)| i);
    let core = s[..core_len].trim_end_matches(is_group_space);
    // An exponent follows the mantissa directly: "1e5", never "1 e5".
    let (exponent, rest) = if core.len() == core_len {
        split_exponent(&s[core_len..])
    } else {
        (None, &s[core_len..])
    };
    let tail = rest.trim();
    if !core.chars().any(|c| c.is_ascii_digit()) {
        return Err(NumberError::NotANumber);
    }
    if !tail.is_empty() {
        if affix.is_some() || !is_suffix(tail) {
            return Err(if tail.chars().all(char::is_alphabetic) {
                NumberError::UnknownUnit(tail.to_string())
            } else {
                NumberError::NotANumber
            });
        }
        affix = Some(tail.to_string());
    }
    Ok(Parts {
        negative,
        core,
        exponent,
        affix,
    })
}

/// An exponent (`e` or `E`, an optional `+`, `-` or `−`, digits) at the start of `s`, and what
/// follows it; `(None, s)` when `s` does not start with one.
fn split_exponent(s: &str) -> (Option<&str>, &str) {
    let Some(rest) = s.strip_prefix(['e', 'E']) else {
        return (None, s);
    };
    let sign_len = rest
        .chars()
        .next()
        .filter(|c| matches!(c, '+' | '-' | '\u{2212}'))
        .map_or(0, char::len_utf8);
    let digits = rest[sign_len..]
        .find(|c: char| !c.is_ascii_digit())
        .unwrap_or(rest.len() - sign_len);
    if digits == 0 {
        return (None, s);
    }
    let end = sign_len + digits;
    (Some(&rest[..end]), &rest[end..])
}

/// Reads digits and separators under `mark`, times ten to `exponent`; see the module doc for
/// the grouping rule. A mantissa in scientific notation has no thousands separators.
fn parse_core(core: &str, exponent: Option<&str>, mark: DecimalMark) -> Result<f64, NumberError> {
    let decimal = match mark {
        DecimalMark::Dot => '.',
        DecimalMark::Comma => ',',
    };
    let mut pieces = core.split(decimal);
    let whole = pieces.next().unwrap_or("");
    let fraction = pieces.next();
    if pieces.next().is_some() {
        return Err(NumberError::Grouping);
    }
    if let Some(f) = fraction {
        if f.is_empty() || !f.chars().all(|c| c.is_ascii_digit()) {
            return Err(NumberError::Grouping);
        }
    }
    let mut digits = String::with_capacity(core.len() + 1);
    let separator_kinds: Vec<char> = {
        let mut kinds: Vec<char> = whole
            .chars()
            .filter(|c| !c.is_ascii_digit())
            .map(|c| if is_group_space(c) { ' ' } else { c })
            .collect();
        sorting::sort(&mut kinds);
        kinds.dedup();
        kinds
    };
    if exponent.is_some() && !separator_kinds.is_empty() {
        return Err(NumberError::Grouping);
    }
    match separator_kinds.as_slice() {
        [] => digits.push_str(if whole.is_empty() { "0" } else { whole }),
        [kind] => {
            let groups: Vec<&str> = whole
                .split(|c: char| (if is_group_space(c) { ' ' } else { c }) == *kind)
                .collect();
            // A first group starting with 0 groups nothing: "0,500" is no 500, nor "012,345".
            let well_formed = groups.iter().enumerate().all(|(i, g)| {
                let len_ok = if i == 0 {
                    (1..=3).contains(&g.len()) && !g.starts_with('0')
                } else {
                    g.len() == 3
                };
                len_ok && g.chars().all(|c| c.is_ascii_digit())
            });
            if !well_formed {
                return Err(NumberError::Grouping);
            }
            groups.iter().for_each(|g| digits.push_str(g));
        }
        _ => return Err(NumberError::Grouping),
    }
    if let Some(f) = fraction {
        digits.push('.');
        digits.push_str(f);
    }
    if let Some(e) = exponent {
        digits.push('e');
        digits.push_str(&e.replace('\u{2212}', "-"));
    }
    // Rust's float parsing rounds correctly, so every way of writing one decimal number (with
    // or without grouping or exponent) gives the same f64.
    digits.parse().map_err(|_| NumberError::NotANumber)
}

#[cfg(test)]
mod tests {
    use super::*;
    use DecimalMark::{Comma, Dot};

    fn value(cell: &str, mark: DecimalMark) -> Option<f64> {
        parse_number(cell, mark).ok().map(|n| n.value)
    }

    // Cells that mark nothing or put the minus last: refused, each with what to write.
    #[test]
    fn dashes_words_for_nothing_and_trailing_minus_say_what_to_write() {
        let check = |cell: &str, mark: DecimalMark, expected: NumberError| {
            assert_eq!(parse_number(cell, mark), Err(expected), "{cell:?}");
        };
        for dash in ["-", "--", " \u{2014} ", "\u{2013}"] {
            check(dash, Dot, NumberError::Dash);
        }
        check("Nil", Dot, NumberError::NoneWord("nil".to_string()));
        check("NONE", Dot, NumberError::NoneWord("none".to_string()));
        check("7-", Dot, NumberError::TrailingMinus("-7".to_string()));
        check(
            "1,200.50 -",
            Dot,
            NumberError::TrailingMinus("-1200.5".to_string()),
        );
        check(
            "12,5-",
            Comma,
            NumberError::TrailingMinus("-12,5".to_string()),
        );
        check("0-", Dot, NumberError::TrailingMinus("0".to_string()));
        assert_eq!(
            NumberError::TrailingMinus("0".to_string()).message(Dot),
            "expected a number without a minus after it: write 0"
        );
        check("-7-", Dot, NumberError::NotANumber);
        check("7--", Dot, NumberError::NotANumber);
        // Thousands of them (a review overflowed the stack with 15,000).
        check(
            &format!("7{}", "-".repeat(100_000)),
            Dot,
            NumberError::NotANumber,
        );
        check("7x", Dot, NumberError::UnknownUnit("x".to_string()));
        let said = NumberError::TrailingMinus("-7".to_string()).message(Dot);
        assert!(said.contains("write -7 if this is a return"), "{said}");
        assert!(NumberError::Dash
            .message(Dot)
            .contains("write 0 if nothing sold"));
    }

    #[test]
    fn dot_mark_reads_comma_groups() {
        assert_eq!(value("1,234.5", Dot), Some(1234.5));
        assert_eq!(value("1,234,567", Dot), Some(1_234_567.0));
        assert_eq!(value("12,5", Dot), None);
        assert_eq!(value("1'234.50", Dot), Some(1234.5));
    }

    #[test]
    fn comma_mark_reads_dot_and_space_groups() {
        assert_eq!(value("1.234,5", Comma), Some(1234.5));
        assert_eq!(value("1 234,5", Comma), Some(1234.5));
        assert_eq!(value("1\u{a0}234,5", Comma), Some(1234.5));
        assert_eq!(value("1\u{202f}234\u{202f}567", Comma), Some(1_234_567.0));
        assert_eq!(value("0,25", Comma), Some(0.25));
        assert_eq!(value(",5", Comma), Some(0.5));
    }

    #[test]
    fn currency_and_units_are_stripped_and_named() {
        let n = parse_number("$1,200", Dot).unwrap();
        assert_eq!((n.value, n.affix.as_deref()), (1200.0, Some("$")));
        let n = parse_number("1 200 €", Comma).unwrap();
        assert_eq!((n.value, n.affix.as_deref()), (1200.0, Some("€")));
        assert_eq!(value("12 kg", Dot), Some(12.0));
        assert_eq!(value("12KG", Dot), Some(12.0));
        assert_eq!(value("£3.50", Dot), Some(3.5));
        assert_eq!(value("EUR 7", Dot), Some(7.0));
        assert_eq!(value("1.2M", Dot), None);
        assert_eq!(value("12x", Dot), None);
        assert_eq!(
            parse_number("12 apples", Dot),
            Err(NumberError::UnknownUnit("apples".into()))
        );
    }

    #[test]
    fn signs_and_accounting_parentheses() {
        assert_eq!(value("-4", Dot), Some(-4.0));
        assert_eq!(value("\u{2212}4", Dot), Some(-4.0));
        assert_eq!(value("(1,200)", Dot), Some(-1200.0));
        assert_eq!(value("-$12", Dot), Some(-12.0));
        assert_eq!(value("$-12", Dot), Some(-12.0));
    }

    #[test]
    fn not_numbers() {
        for cell in [
            "", "abc", "12-", "--3", "1,2,3", "1 23", "12x", "12 e5", "1e", "e5",
        ] {
            assert!(!looks_number(cell), "{cell:?} read as a number");
        }
    }

    /// (cell, mark, the value or the error).
    fn check(cell: &str, mark: DecimalMark, expected: Result<f64, NumberError>) {
        let got = parse_number(cell, mark).map(|n| n.value);
        assert_eq!(got, expected, "{cell:?} with a {} mark", mark.as_str());
    }

    #[test]
    fn scientific_notation() {
        check("1e5", Dot, Ok(1e5));
        check("1E5", Comma, Ok(1e5));
        check("1.5E+03", Dot, Ok(1500.0));
        check("2,5e3", Comma, Ok(2500.0));
        check("-4E-1", Dot, Ok(-0.4));
        check("4e\u{2212}1", Dot, Ok(0.4));
        check("1.5e3 kg", Dot, Ok(1500.0));
        check("$2e3", Dot, Ok(2000.0));
        // The same decimal number written two ways is the same f64.
        check("1.2345e3", Dot, Ok("1234.5".parse().unwrap()));
        // No grouping in a mantissa, and the file's mark only.
        check("1,500e3", Dot, Err(NumberError::Grouping));
        check("1.5e3", Comma, Err(NumberError::Grouping));
        check("1.e3", Dot, Err(NumberError::Grouping));
    }

    #[test]
    fn infinities_and_oversized_values_are_refused_but_look_like_numbers() {
        for cell in [
            "inf",
            "-inf",
            "+Infinity",
            "NaN",
            "nan",
            "\u{221e}",
            "\u{2212}\u{221e}",
        ] {
            check(cell, Dot, Err(NumberError::NotFinite));
            assert!(looks_number(cell), "{cell}");
        }
        // The bound, 10^15, and the first values past it.
        check("1000000000000000", Dot, Ok(1e15));
        check("-1e15", Dot, Ok(-1e15));
        check("1,000,000,000,000,000.0", Dot, Ok(1e15));
        check("1000000000000000.5", Dot, Err(NumberError::TooLarge));
        check("1000000000000001", Dot, Err(NumberError::TooLarge));
        check("1e16", Dot, Err(NumberError::TooLarge));
        check(&"9".repeat(400), Dot, Err(NumberError::TooLarge));
        check("1e99999999999999999999", Dot, Err(NumberError::TooLarge));
        assert!(looks_number(&"9".repeat(400)));
        // Tiny values are values.
        check("1e-300", Dot, Ok(1e-300));
    }
}
