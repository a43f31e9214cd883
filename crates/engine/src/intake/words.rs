//! The header words Intake knows for the calendar's years, quarters, months and weeks, in one
//! place: English and (from memory) the common German, French, Dutch, Spanish and Italian ones
//! written in plain letters. Matched as whole words of a header, any ASCII case; callers that
//! may meet capitals beyond ASCII ("ANNÉE") lower-case the header first.
//!
//! Kept apart from: what a column under such a header holds (the readers decide that from
//! its cells) and the words for periods in general ([`super::table::PERIOD_WORDS`]).

/// Header words naming a calendar year.
pub(super) const YEAR_WORDS: [&str; 9] = [
    "year", "yr", "jahr", "annee", "année", "jaar", "ano", "año", "anno",
];

/// Header words naming the month of a year ("Month", "Monat", "Mois", "Maand", "Mes",
/// "Mese").
pub(super) const MONTH_WORDS: [&str; 7] = ["month", "mth", "monat", "mois", "maand", "mes", "mese"];

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
