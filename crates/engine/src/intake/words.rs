//! The words Intake knows for the calendar's years, quarters, months, weeks and days, in one
//! place: the header words, English and (from memory) the common German, French, Dutch,
//! Spanish and Italian ones, in lower case, matched as whole words of a header in any case
//! ([`super::headers::header_says`]), and their short forms ("Mon", "Q"); month and weekday
//! names in those languages; and the one rule for a part of the year named by a word and its
//! number ("Qtr 1", "M01", "1st Qtr", [`numbered_part`], over [`runs`]), which grids' headers
//! and a part column's cells are read by.
//!
//! Kept apart from: what a column under such a header holds (the readers decide that from
//! its cells) and the words for periods in general ([`super::headers::PERIOD_WORDS`]).

use super::label::month_name;

/// Header words naming a calendar year.
pub(super) const YEAR_WORDS: [&str; 11] = [
    "year",
    "yr",
    "yyyy",
    "jahr",
    "kalenderjahr",
    "annee",
    "année",
    "jaar",
    "ano",
    "año",
    "anno",
];

/// Header words naming the day of a month beside a year and a month ("Day", "Jour", "Día",
/// "Giorno"): only there.
pub(super) const DAY_WORDS: [&str; 4] = ["day", "jour", "día", "giorno"];

/// Day words that name other things in English files ("Tag", a shelf tag; "Dia", a
/// diameter), each with the year words of its own language: a day only beside such a year.
pub(super) const DAY_WORDS_BESIDE_THEIR_YEAR: [(&str, &[&str]); 3] = [
    ("tag", &["jahr", "kalenderjahr"]),
    ("dag", &["jaar"]),
    ("dia", &["ano", "año"]),
];

/// Header words naming the month of a year ("Month", "Monat", "Mois", "Maand", "Mes",
/// "Mese").
pub(super) const MONTH_WORDS: [&str; 9] = [
    "month",
    "mth",
    "monat",
    "kalendermonat",
    "monatsnr",
    "mois",
    "maand",
    "mes",
    "mese",
];

/// Header words naming the quarter of a year ("Quarter", "Quartal", "Trimestre", "Kwartaal").
pub(super) const QUARTER_WORDS: [&str; 5] = ["quarter", "qtr", "quartal", "trimestre", "kwartaal"];

/// Header words that name weeks ("KW": German Kalenderwoche).
pub(super) const WEEK_WORDS: [&str; 16] = [
    "week",
    "weeks",
    "weekly",
    "wk",
    "wks",
    "kw",
    "woche",
    "wochen",
    "kalenderwoche",
    "kalenderwochen",
    "semaine",
    "semaines",
    "semana",
    "semanas",
    "settimana",
    "settimane",
];

/// Of those, the ones naming one week of a year, which a week column beside a year is joined
/// under: not the plurals, which count weeks ("Weeks" 52: the weeks open; a review found it
/// read as each year's week 52).
pub(super) const WEEK_PART_WORDS: [&str; 8] = [
    "week",
    "wk",
    "kw",
    "woche",
    "kalenderwoche",
    "semaine",
    "semana",
    "settimana",
];

/// The month a German, French, Dutch, Spanish or Italian month's name or abbreviation names
/// (from memory; lower case, a final dot left off: "märz", "mär", "mrz", "janv", "mei",
/// "ene", "gen"), read only in a month column beside a year, where nothing else is meant.
/// English names are [`super::label::month_name`]'s.
pub(super) fn month_in_other_languages(word: &str) -> Option<u32> {
    const MONTHS: [&[&str]; 12] = [
        &[
            "januar", "jänner", "jän", "janvier", "janv", "januari", "enero", "ene", "gennaio",
            "gen",
        ],
        &[
            "februar", "février", "fevrier", "févr", "fevr", "fév", "fev", "februari", "febrero",
            "febbraio",
        ],
        &[
            "märz", "maerz", "mär", "mrz", "mars", "maart", "mrt", "marzo",
        ],
        &["avril", "avr", "abril", "abr", "aprile"],
        &["mai", "mei", "mayo", "maggio", "mag"],
        &["juni", "juin", "junio", "giugno", "giu"],
        &["juli", "juillet", "juil", "julio", "luglio", "lug"],
        &["août", "aout", "augustus", "agosto", "ago"],
        &["septembre", "septiembre", "setiembre", "settembre", "set"],
        &["oktober", "okt", "octobre", "octubre", "ottobre", "ott"],
        &["novembre", "noviembre"],
        &[
            "dezember",
            "dez",
            "décembre",
            "decembre",
            "déc",
            "diciembre",
            "dic",
            "dicembre",
        ],
    ];
    let word = word.trim().trim_end_matches('.').to_lowercase();
    MONTHS
        .iter()
        .position(|names| names.contains(&word.as_str()))
        .map(|i| i as u32 + 1)
}

/// The month a month's name or abbreviation names, in English ([`super::label::month_name`])
/// or another of these languages (a final dot left off: "Jan.", "Mär", "janv."): the one test
/// for a month written out, in a month column's cells and a year grid's headers.
pub(super) fn month_named(word: &str) -> Option<u32> {
    let word = word.trim().trim_end_matches('.');
    month_name(word).or_else(|| month_in_other_languages(word))
}

/// Whether a word (any case, a final dot left off) is a weekday's full name in German,
/// French, Dutch, Spanish or Italian (from memory: "Montag", "lundi", "miércoles"): a column
/// of them beside the dates is a calendar detail, not items. English ones are
/// [`super::label::weekday_name`]'s.
pub(super) fn weekday_in_other_languages(word: &str) -> bool {
    const WEEKDAYS: [&str; 42] = [
        "montag",
        "dienstag",
        "mittwoch",
        "donnerstag",
        "freitag",
        "samstag",
        "sonnabend",
        "sonntag",
        "lundi",
        "mardi",
        "mercredi",
        "jeudi",
        "vendredi",
        "samedi",
        "dimanche",
        "maandag",
        "dinsdag",
        "woensdag",
        "donderdag",
        "vrijdag",
        "zaterdag",
        "zondag",
        "lunes",
        "martes",
        "miércoles",
        "miercoles",
        "jueves",
        "viernes",
        "sábado",
        "sabado",
        "domingo",
        "lunedì",
        "lunedi",
        "martedì",
        "martedi",
        "mercoledì",
        "mercoledi",
        "giovedì",
        "giovedi",
        "venerdì",
        "venerdi",
        "domenica",
    ];
    let word = word.trim().trim_end_matches('.').to_lowercase();
    WEEKDAYS.contains(&word.as_str())
}

/// Whether a word is a weekday shortened to two or three letters in English or one of those
/// languages ("Mo", "Tu", "Di", "lun.", "mié", "zo"): read so only under a header naming the
/// weekday ([`WEEKDAY_WORDS`]), since alone two letters are as often a country or a state
/// ("FR", "MA"; a review found them taken for weekdays). Reviews found "Mo / Kelle", "Di /
/// Kelle" and "Mo", "Tu" ... planned as items before.
pub(super) fn weekday_shortened(word: &str) -> bool {
    const SHORT: [&str; 37] = [
        "tu", "we", "th", "su", "mo", "di", "mi", "do", "fr", "sa", "so", "lun", "mar", "mer",
        "jeu", "ven", "sam", "dim", "ma", "wo", "vr", "za", "zo", "mié", "mie", "jue", "vie",
        "sáb", "sab", "dom", "gio", "lu", "me", "je", "ve", "ju", "sá",
    ];
    let word = word.trim().trim_end_matches('.').to_lowercase();
    SHORT.contains(&word.as_str()) || weekday_in_other_languages(&word)
}

/// Header words naming a weekday column, said anywhere in the header ("Weekday", "Day of
/// week", "Wochentag", "Jour", "Día").
pub(super) const WEEKDAY_WORDS: [&str; 10] = [
    "weekday",
    "day",
    "wochentag",
    "tag",
    "jour",
    "dag",
    "weekdag",
    "dia",
    "día",
    "giorno",
];

/// Short forms a header may name a month, quarter or week by ("Mon", "Mnth", "MM"; "Q",
/// "Trim"; "W"): joined with a year only over parts written out ("Jan.", or codes "Q1" of
/// which some year holds enough, [`super::joined::YearPart::whole_year`]), never over
/// numbers, which under them beside plain years are refused where some item's year holds as
/// many (`build/parts_in_years.rs`).
pub(super) const MONTH_SHORT_FORMS: [&str; 8] =
    ["mon", "mo", "mnth", "mnt", "mos", "m", "mm", "mnd"];
pub(super) const QUARTER_SHORT_FORMS: [&str; 5] = ["q", "qr", "qtrs", "trim", "quart"];
pub(super) const WEEK_SHORT_FORMS: [&str; 1] = ["w"];

/// The runs of digits and of other letters or digits in a cell, anything else a break: "M01"
/// is "M", "01"; "1st Qtr" is "1", "st", "Qtr"; "01-Jan" is "01", "Jan". How a part's word and
/// its number are told apart, here and in a part column's cells (`joined.rs`).
pub(super) fn runs(cell: &str) -> Vec<String> {
    let mut tokens: Vec<String> = Vec::new();
    let mut broken = true;
    for c in cell.chars() {
        if !c.is_alphanumeric() {
            broken = true;
            continue;
        }
        match tokens.last_mut() {
            Some(t)
                if !broken && t.ends_with(|l: char| l.is_ascii_digit() == c.is_ascii_digit()) =>
            {
                t.push(c)
            }
            _ => tokens.push(c.to_string()),
        }
        broken = false;
    }
    tokens
}

/// A part of the year counted by its number within the year.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(super) enum NumberedPart {
    Month,
    Quarter,
    /// An ISO 8601 week.
    Week,
    Half,
    /// An accounting period (1 to 13), which no calendar places.
    Period,
}

impl NumberedPart {
    /// How many there are in a year.
    fn count(self) -> u32 {
        match self {
            NumberedPart::Month => 12,
            NumberedPart::Quarter => 4,
            NumberedPart::Week => 53,
            NumberedPart::Half => 2,
            NumberedPart::Period => 13,
        }
    }

    /// The words its number is written after ("Qtr 1", "M01", "Wk 5").
    fn prefixes(self) -> &'static [&'static str] {
        match self {
            NumberedPart::Month => &["month", "mth", "m"],
            NumberedPart::Quarter => &["quarter", "qtr", "q", "trim"],
            NumberedPart::Week => &["week", "wk", "w"],
            NumberedPart::Half => &["half", "h"],
            NumberedPart::Period => &["period", "p"],
        }
    }

    const ALL: [NumberedPart; 5] = [
        NumberedPart::Month,
        NumberedPart::Quarter,
        NumberedPart::Week,
        NumberedPart::Half,
        NumberedPart::Period,
    ];
}

/// The part of the year one cell names by a word and its number, with the number: "M01",
/// "Month 1", "Mth 1", "Q1", "Qtr 1", "Quarter 1", "1st Qtr", "W5", "Wk 5", "Week 5", "H1",
/// "Half 1", "P1", "Period 13", "1. Quartal", "Trim. 2" (any case; a space, a dot or nothing
/// between). The number has one or two digits and lies within the part's count (an
/// ordinal's suffix must agree with it). `None` for anything else: a month's name is not
/// numbered ([`month_named`]).
pub(super) fn numbered_part(cell: &str) -> Option<(NumberedPart, u32)> {
    let tokens = runs(&cell.trim().to_lowercase());
    let words: Vec<&str> = tokens.iter().map(String::as_str).collect();
    let prefixed = |word: &str| {
        NumberedPart::ALL
            .into_iter()
            .find(|part| part.prefixes().contains(&word))
    };
    let (part, number) = match words.as_slice() {
        [word, n] if prefixed(word).is_some() => (prefixed(word)?, *n),
        [n @ ("1" | "2" | "3" | "4"), suffix, "qtr" | "quarter"]
            if ["st", "nd", "rd", "th"][n.parse::<usize>().ok()? - 1] == *suffix =>
        {
            (NumberedPart::Quarter, *n)
        }
        // The number first, as German, French, Dutch, Spanish and Italian write it ("1.
        // Quartal", "1 trimestre", "1e kwartaal" is not read).
        [n, "quartal" | "trimestre" | "kwartaal" | "quarter"] => (NumberedPart::Quarter, *n),
        _ => return None,
    };
    let number: u32 = (number.len() <= 2 && number.bytes().all(|b| b.is_ascii_digit()))
        .then(|| number.parse().ok())??;
    (1..=part.count())
        .contains(&number)
        .then_some((part, number))
}

#[cfg(test)]
mod tests {
    use super::NumberedPart::{Half, Month, Period, Quarter, Week};
    use super::*;

    /// A cell -> the numbered part it names.
    fn check(cell: &str, expected: Option<(NumberedPart, u32)>) {
        assert_eq!(numbered_part(cell), expected, "{cell:?}");
    }

    #[test]
    fn cells_name_numbered_parts_of_the_year() {
        check("M01", Some((Month, 1)));
        check("Month 12", Some((Month, 12)));
        check("mth.3", Some((Month, 3)));
        check("Q4", Some((Quarter, 4)));
        check("Qtr 1", Some((Quarter, 1)));
        check("QUARTER 2", Some((Quarter, 2)));
        check("1st Qtr", Some((Quarter, 1)));
        check("3rd quarter", Some((Quarter, 3)));
        check("W53", Some((Week, 53)));
        check("Wk 5", Some((Week, 5)));
        check("H2", Some((Half, 2)));
        check("P13", Some((Period, 13)));
        check("Period 1", Some((Period, 1)));
        check("1. Quartal", Some((Quarter, 1)));
        check("Trim. 4", Some((Quarter, 4)));
        // Beyond the part's count, three digits, a wrong ordinal, more words, a name.
        check("Q5", None);
        check("M13", None);
        check("M001", None);
        check("2st Qtr", None);
        check("Qtr 1 total", None);
        check("Jan", None);
        check("Q", None);
        check("Item 1", None);
    }

    #[test]
    fn month_names_in_other_languages() {
        for (word, month) in [
            ("Mär", 3),
            ("märz", 3),
            ("Mrz", 3),
            ("janv.", 1),
            ("Févr.", 2),
            ("mei", 5),
            ("Okt", 10),
            ("Dez", 12),
            ("ene", 1),
            ("Ago", 8),
            ("gen", 1),
            ("Dicembre", 12),
        ] {
            assert_eq!(month_in_other_languages(word), Some(month), "{word}");
        }
        // English ones are the general reader's; words that are no month stay none.
        assert_eq!(month_in_other_languages("March"), None);
        assert_eq!(month_in_other_languages("Kelle"), None);
    }
}
