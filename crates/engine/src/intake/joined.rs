//! A period written across columns: a year column beside a column of months, quarters or
//! weeks, and for months perhaps a day column (`year,month,sales`, `year,quarter,sales`,
//! `year,week,sales`, `year,month,day,sales`: common ways to keep sales, common practice).
//! Each row's period is read from its cells joined into one label the period reader takes
//! ("2023-07", "2023 Jul", "2023-Q3", "2023-W07", "2023-07-14"), so the reader's rules and
//! errors hold unchanged; an error shows the joined text at the year column, or the part's
//! own cell at its column where the part is what does not read ([`SplitPeriod::part_at_fault`]).
//!
//! Kept apart from: the other column roles ([`super::table`] calls [`SplitPeriod::find`]
//! first, so that month names are not taken for items) and reading labels
//! ([`super::label`]). Found only by the header's words, and only where most rows read so:
//! one bad cell is an error at its row, not another layout. A fiscal year beside months is
//! refused: its months fall in two calendar years, and read as calendar months the rows
//! would be put in the wrong order.

use std::collections::{HashMap, HashSet};

use super::frame::Table;
use super::headers::{header_is_only, header_says};
use super::label::{calendar_name, month_name, parse_label, year_of, Family, Label};
use super::period::{integer_meaning, IntegerMeaning};
use super::table::whole_number;
use super::text::Record;
use super::words::{
    month_in_other_languages, month_named, numbered_part, runs, NumberedPart, DAY_WORDS,
    DAY_WORDS_BESIDE_THEIR_YEAR, MONTH_SHORT_FORMS, MONTH_WORDS, QUARTER_SHORT_FORMS,
    QUARTER_WORDS, WEEK_PART_WORDS, WEEK_SHORT_FORMS, YEAR_WORDS,
};
use super::RowError;
use crate::calendar::{iso_weeks_in_year, Frequency, Period};

/// The part of a year a column beside a year column counts.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum YearPart {
    /// Months: 1 to 12 or month names.
    Month,
    /// Quarters: 1 to 4 or Q1 to Q4.
    Quarter,
    /// ISO 8601 weeks: 1 to 53 or W1 to W53.
    Week,
}

impl YearPart {
    /// The finest first: beside a year, a week column with a month column makes weeks (the
    /// month then a calendar detail).
    pub(crate) const ALL: [YearPart; 3] = [YearPart::Week, YearPart::Month, YearPart::Quarter];

    /// Header words that name this part of a year.
    pub(crate) fn words(self) -> &'static [&'static str] {
        match self {
            YearPart::Month => &MONTH_WORDS,
            YearPart::Quarter => &QUARTER_WORDS,
            YearPart::Week => &WEEK_PART_WORDS,
        }
    }

    /// What a cell of this part is written as, for a refusal.
    fn forms(self) -> &'static str {
        match self {
            YearPart::Month => "a month: 1 to 12 or a month name such as Jan or January",
            YearPart::Quarter => "a quarter: 1 to 4 or Q1 to Q4",
            YearPart::Week => "an ISO week: 1 to 53 or W1 to W53",
        }
    }

    /// How many there are in a year (ISO years have up to 53 weeks).
    pub(crate) fn count(self) -> u32 {
        match self {
            YearPart::Month => 12,
            YearPart::Quarter => 4,
            YearPart::Week => 53,
        }
    }

    /// Short forms of its header words ("Mon", "Q", "W"): joined only over parts written
    /// out ("Jan.", "Q1"); numbers under them beside plain years are refused
    /// (`build/parts_in_years.rs`).
    pub(crate) fn short_forms(self) -> &'static [&'static str] {
        match self {
            YearPart::Month => &MONTH_SHORT_FORMS,
            YearPart::Quarter => &QUARTER_SHORT_FORMS,
            YearPart::Week => &WEEK_SHORT_FORMS,
        }
    }

    /// How many different ones a year's data must hold for a column under a short form ("Q",
    /// "M", "W") to be taken for this part: all the months or quarters (grades "Q1" to "Q3",
    /// sizes 1 to 8 or model numbers under such headers are as common: a review found them
    /// read or refused as quarters and months), and more than half the weeks (nothing else
    /// under "W" runs to 27).
    pub(crate) fn whole_year(self) -> usize {
        match self {
            YearPart::Week => 27,
            _ => self.count() as usize,
        }
    }

    /// Whether a cell is one of this part by number or name: 1 to its count, or (months) a
    /// month's name in English or another language.
    pub(crate) fn holds(self, cell: &str) -> bool {
        let cell = cell.trim().trim_end_matches('.');
        (self == YearPart::Month && month_named(cell).is_some())
            || (whole_number(cell)
                && cell.len() <= 2
                && cell
                    .parse::<u32>()
                    .is_ok_and(|n| (1..=self.count()).contains(&n)))
    }

    /// Its name, plural, in the report's words ("months").
    pub(crate) fn plural(self) -> &'static str {
        match self {
            YearPart::Month => "months",
            YearPart::Quarter => "quarters",
            YearPart::Week => "weeks",
        }
    }

    /// The period of part `number` (1 to its count) of `year`.
    pub(crate) fn period(self, year: i32, number: u32) -> Period {
        match self {
            YearPart::Month => Period::month(year, number),
            YearPart::Quarter => Period::quarter(year, number),
            YearPart::Week => Period::iso_week(year, number),
        }
    }

    /// The frequency of its periods.
    pub(crate) fn frequency(self) -> Frequency {
        match self {
            YearPart::Month => Frequency::Monthly,
            YearPart::Quarter => Frequency::Quarterly,
            YearPart::Week => Frequency::Weekly,
        }
    }

    /// Its name as a header should give it, for a refusal ("Month").
    pub(crate) fn name(self) -> &'static str {
        match self {
            YearPart::Month => "Month",
            YearPart::Quarter => "Quarter",
            YearPart::Week => "Week",
        }
    }

    /// The same part, as a cell names it by its number ("Qtr 1").
    fn numbered(self) -> NumberedPart {
        match self {
            YearPart::Month => NumberedPart::Month,
            YearPart::Quarter => NumberedPart::Quarter,
            YearPart::Week => NumberedPart::Week,
        }
    }

    /// The period family the joined labels must read as.
    fn family(self) -> Family {
        match self {
            YearPart::Month => Family::Month,
            YearPart::Quarter => Family::Quarter,
            YearPart::Week => Family::Week,
        }
    }
}

/// Whether column `j` is headed by a short form of a part of the year of two letters or more
/// ("MM", "Mon", "Wk") and every filled cell is one of that part: a column of months or
/// weeks, never the quantity (a review found "MM" read as the quantity beside "Kilos"). A
/// single letter ("M", "Q", "W") is as often the quantity, over small counts too (a review
/// found "Temp" read beside them when they were passed over).
pub(crate) fn short_form_of_parts(table: &Table, rows: &[&Record], j: usize) -> bool {
    let name = table.column_name(j);
    if name.trim().chars().count() < 2 {
        return false;
    }
    YearPart::ALL.into_iter().any(|part| {
        header_is_only(&name, part.short_forms()) && {
            let cells = table.column(j, rows);
            let mut filled = cells.iter().filter(|c| !c.trim().is_empty()).peekable();
            filled.peek().is_some() && filled.all(|c| part.holds(c))
        }
    })
}

/// The different cells of column `part` on each year's rows (the year as written in column
/// `year`), of the cells `keep` takes, trimmed.
fn parts_by_year<'r>(
    rows: &[&'r Record],
    year: usize,
    part: usize,
    keep: impl Fn(&str) -> bool,
) -> HashMap<&'r str, HashSet<&'r str>> {
    let mut parts: HashMap<&str, HashSet<&str>> = HashMap::new();
    for row in rows {
        let cell = |k: usize| row.cells.get(k).map_or("", |c| c.trim());
        if keep(cell(part)) {
            parts.entry(cell(year)).or_default().insert(cell(part));
        }
    }
    parts
}

/// Words that make a year a fiscal one.
const FISCAL_WORDS: [&str; 3] = ["fiscal", "financial", "fy"];

/// The columns one period is written across.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) struct SplitPeriod {
    year: usize,
    part: usize,
    how: YearPart,
    day: Option<usize>,
}

impl SplitPeriod {
    /// Finds a year column (the period column found, or else any of `numbers`) whose header
    /// says year and whose cells are mostly years of four digits or two (1969 to 2068), and another column whose header
    /// names a part of a year and whose cells, joined to their row's year, mostly read as that
    /// part's periods; then, beside months, a column named day whose joined cells mostly read
    /// as dates. `Err` for a fiscal year beside such a column.
    pub(crate) fn find(
        table: &Table,
        rows: &[&Record],
        period: Option<usize>,
        numbers: &[usize],
    ) -> Result<Option<SplitPeriod>, RowError> {
        let Some(header) = &table.header else {
            return Ok(None);
        };
        // Headers that name only the part ("Month", "Month no"), not an item that holds the
        // word ("Year planner", "Month end").
        let named = |j: usize, words: &[&str]| header_is_only(&table.column_name(j), words);
        let year_or_fiscal: Vec<&str> = YEAR_WORDS.iter().chain(&FISCAL_WORDS).copied().collect();
        let year_named =
            |j: usize| named(j, &year_or_fiscal) && header_says(&table.column_name(j), &YEAR_WORDS);
        // The part's word, the year's beside it allowed ("Month of year", "Week of year").
        let names_the_part = |j: usize, how: YearPart| {
            let with_year: Vec<&str> = how.words().iter().chain(&YEAR_WORDS).copied().collect();
            header_is_only(&table.column_name(j), &with_year)
                && header_says(&table.column_name(j), how.words())
        };
        let is_part = |j: usize| YearPart::ALL.iter().any(|part| names_the_part(j, *part));
        // Most cells, not all: one bad cell is an error at its row, not another layout.
        let most = |good: usize| !rows.is_empty() && good * 2 > rows.len();
        let years: Vec<usize> = match period {
            Some(p) => vec![p],
            None => numbers.to_vec(),
        };
        let Some(year) = years.into_iter().find(|j| {
            year_named(*j)
                && !is_part(*j)
                && most(
                    table
                        .column(*j, rows)
                        .iter()
                        .filter(|c| whole_number(c) && year_of(c).is_some())
                        .count(),
                )
        }) else {
            return Ok(None);
        };
        let reads_as = |split: &SplitPeriod, family: Family| {
            most(
                split
                    .labels(rows)
                    .iter()
                    .filter(|label| parse_label(label).is_some_and(|l| l.family() == family))
                    .count(),
            )
        };
        let others = || (0..table.width).filter(move |j| *j != year);
        // A column named "Period" beside a year may hold months, quarters or weeks ("Jan",
        // "Q1"): tried as each, after the columns named as the part.
        // Only text ("Jan", "Q1"): numbers under "Period" (1 to 13) could be any of them.
        let period_named = |j: usize| {
            named(j, &PERIOD_PART_WORDS)
                && most(
                    table
                        .column(j, rows)
                        .iter()
                        .filter(|c| c.chars().any(char::is_alphabetic))
                        .count(),
                )
        };
        // A short form ("Mon", "M", "Q", "W") over parts written out, not numbers, which
        // under it could count anything: month names ("Jan.": a review found them under "Mon"
        // beside a year made an item of each month), or codes ("Q1", "W05") of which some
        // year holds all its parts ("W1", "W2" width classes and "Q1" to "Q3" grades had
        // been read as weeks and quarters, the others filled as closed).
        let short_named = |j: usize, how: YearPart| {
            if !named(j, how.short_forms()) {
                return false;
            }
            let cells = table.column(j, rows);
            let month_names = cells.iter().filter(|c| month_named(c).is_some()).count();
            if how == YearPart::Month && most(month_names) {
                return true;
            }
            let fullest = parts_by_year(rows, year, j, |c| c.chars().any(char::is_alphabetic))
                .values()
                .map(HashSet::len)
                .max()
                .unwrap_or(0);
            most(
                cells
                    .iter()
                    .filter(|c| c.chars().any(char::is_alphabetic))
                    .count(),
            ) && fullest >= how.whole_year()
        };
        // A header that is itself one numbered part ("Qtr 1", "Q1", "M01", "Week 1") heads
        // that part's values in a grid with the calendar across, never the column of parts:
        // taken for it, counts of 1 to 4 were read as quarters and the next column's sales as
        // the demand.
        let one_part = |j: usize, how: YearPart| {
            let name = table.column_name(j);
            let part = part_text(&name, how);
            part != name.trim() && part.bytes().all(|b| b.is_ascii_digit())
        };
        // A part column tells the rows of a year apart: where no year holds two different
        // parts on its rows ("Weeks open" 52 or 53 beside each item's year, "Months" 12), it
        // counts something about each year, not which part a row is; joined, a year's total
        // had been read as its last week or month (a review). One row a year in different
        // months (2022-03, 2023-07) is then read as yearly, each year's total the row's.
        let varies = |k: usize| {
            let parts = parts_by_year(rows, year, k, |c| !c.is_empty());
            parts.len() <= 1 || parts.values().any(|p| p.len() >= 2)
        };
        let Some(mut split) = YearPart::ALL.into_iter().find_map(|how| {
            others()
                .filter(|j| {
                    (names_the_part(*j, how) && !one_part(*j, how))
                        || period_named(*j)
                        || short_named(*j, how)
                })
                .filter(|j| varies(*j))
                .map(|part| SplitPeriod {
                    year,
                    part,
                    how,
                    day: None,
                })
                .find(|split| reads_as(split, how.family()))
        }) else {
            return unread_part(table, rows, year).map_or(Ok(None), Err);
        };
        let name = table.column_name(year);
        if header_says(&name, &FISCAL_WORDS) {
            return Err(RowError {
                row: header.line,
                column: name.clone(),
                text: name,
                message: format!(
                    "expected calendar years beside the column \"{}\": a fiscal year's months \
                     fall in two calendar years, so they cannot be placed; write each period as \
                     a calendar month (e.g. 2024-07) or a date",
                    table.column_name(split.part)
                ),
            });
        }
        if split.how == YearPart::Month {
            if let Some(error) = fiscal_order(table, rows, &split) {
                return Err(error);
            }
            // "Day" and the words no English header means otherwise; "Tag", "Dag" and "Dia"
            // (a shelf tag, a pot's diameter in English files: a review found them read as
            // days) only beside a year named in their own language.
            let year_name = table.column_name(year);
            let day_words: Vec<&str> = DAY_WORDS
                .iter()
                .copied()
                .chain(
                    DAY_WORDS_BESIDE_THEIR_YEAR
                        .iter()
                        .filter(|(_, years)| header_says(&year_name, years))
                        .map(|(day, _)| *day),
                )
                .collect();
            split.day = others()
                .filter(|j| *j != split.part && named(*j, &day_words) && !is_part(*j))
                .find(|j| {
                    let with_day = SplitPeriod {
                        day: Some(*j),
                        ..split
                    };
                    reads_as(&with_day, Family::Date)
                });
        }
        Ok(Some(split))
    }

    /// The year column: the period column of the plan.
    pub(crate) fn year(&self) -> usize {
        self.year
    }

    /// Every column the period is written across.
    pub(crate) fn columns(&self) -> Vec<usize> {
        [Some(self.year), Some(self.part), self.day]
            .into_iter()
            .flatten()
            .collect()
    }

    /// One row's period label from its cells, `cell(j)` the cell of column `j`: a month,
    /// quarter or week number becomes "2023-07", "2023-Q3" or "2023-W07"; a word is put after
    /// the year ("2023 Jul", "2023 Q3"); with a day, "2023-07-14" or "14 Jul 2023". The
    /// period reader takes these, or refuses them with the joined text.
    pub(crate) fn label<'a>(&self, cell: impl Fn(usize) -> &'a str) -> String {
        let written = cell(self.year).trim();
        // Two-digit years as the period reader takes them (1969 to 2068).
        let year = match year_of(written) {
            Some(y) if written.len() == 2 && whole_number(written) => y.to_string(),
            _ => written.to_string(),
        };
        let part = part_text(cell(self.part), self.how);
        let part = part.as_str();
        let number = whole_number(part)
            .then(|| part.parse::<u32>().ok())
            .flatten();
        match (self.day.map(|d| cell(d).trim()), number, self.how) {
            (Some(day), Some(n), _) => format!("{year}-{n:02}-{day:0>2}"),
            (Some(day), None, _) => format!("{day} {part} {year}"),
            (None, Some(n), YearPart::Month) => format!("{year}-{n:02}"),
            (None, Some(n), YearPart::Quarter) => format!("{year}-Q{n}"),
            (None, Some(n), YearPart::Week) => format!("{year}-W{n:02}"),
            (None, None, _) => format!("{year} {part}"),
        }
    }

    /// Where a row's period fails to read because of its part, not its year: the part column,
    /// its cell and the error to give, when the year is a year and the part cell is no number
    /// within the part's count (or week 53 of a year of 52) and no month name (a month word
    /// not known, "Febr"; a review found such rows refused at the year's column with the
    /// joined text). `None` otherwise: the period reader's own error, at the year's column,
    /// names the joined label.
    pub(crate) fn part_at_fault<'r>(
        &self,
        table: &Table,
        row: &'r Record,
    ) -> Option<(usize, &'r str, String)> {
        let cell = |j: usize| row.cells.get(j).map_or("", |c| c.trim());
        let year = cell(self.year);
        if !(whole_number(year) && year_of(year).is_some()) {
            return None;
        }
        let part = part_text(cell(self.part), self.how);
        let named_month = self.how == YearPart::Month && month_name(&part).is_some();
        let number = whole_number(&part)
            .then(|| part.parse::<u32>().ok())
            .flatten();
        let year_name = table.column_name(self.year);
        let expected = || {
            format!(
                "expected {} beside the year in column \"{year_name}\"",
                self.how.forms()
            )
        };
        let message = match number {
            // A number beyond the part's count ("13", "Q5") is the part's fault too.
            Some(n) if n == 0 || n > self.how.count() => expected(),
            // Week 53 of a year of 52 ISO weeks.
            Some(n) if self.how == YearPart::Week => {
                let weeks = year_of(year).map_or(53, iso_weeks_in_year);
                if n <= weeks {
                    return None;
                }
                format!(
                    "expected an ISO week of {year} beside the year in column \"{year_name}\": \
                     {year} has {weeks} ISO weeks"
                )
            }
            Some(_) => return None,
            None if named_month => return None,
            None => expected(),
        };
        Some((self.part, cell(self.part), message))
    }

    /// [`SplitPeriod::label`] of each of `rows`.
    pub(crate) fn labels(&self, rows: &[&Record]) -> Vec<String> {
        rows.iter()
            .map(|row| self.label(|j| row.cells.get(j).map_or("", String::as_str)))
            .collect()
    }

    /// For the report: `from the columns "year" and "month"` (or "year", "month" and "day").
    pub(crate) fn describe(&self, table: &Table) -> String {
        let names: Vec<String> = self
            .columns()
            .into_iter()
            .map(|j| format!("\"{}\"", table.column_name(j)))
            .collect();
        match names.as_slice() {
            [first, second] => format!("from the columns {first} and {second}"),
            [first, second, third] => format!("from the columns {first}, {second} and {third}"),
            _ => String::new(),
        }
    }
}

/// A part cell as the joined label takes it: a number written after its part's word ("Qtr 1",
/// "Quarter 2", "Week 1", "Wk 1", "M01", "Month 1"; [`numbered_part`]) becomes the number,
/// and a month cell holding one month name beside a number or a full stop ("Jan.", "01-Jan")
/// the name (another language's, "Mär", its number). A
/// review found each of these beside a year read as yearly items, "Qtr 1" to "Qtr 4",
/// without a word.
fn part_text(cell: &str, how: YearPart) -> String {
    let cell = cell.trim();
    if let Some((part, number)) = numbered_part(cell) {
        if part == how.numbered() {
            return number.to_string();
        }
    }
    if how != YearPart::Month {
        return cell.to_string();
    }
    let tokens = runs(cell);
    let digits = |t: &str| t.bytes().all(|b| b.is_ascii_digit());
    let names: Vec<&String> = tokens.iter().filter(|t| !digits(t)).collect();
    match names.as_slice() {
        [name] if tokens.len() <= 2 && calendar_name(name) => (*name).clone(),
        // "Mär", "janv.", "mei": the month's number, as no period label reads them.
        [name] if tokens.len() <= 2 => {
            month_in_other_languages(name).map_or_else(|| cell.to_string(), |m| m.to_string())
        }
        _ => cell.to_string(),
    }
}

/// Header words of a column counting periods within a year that no calendar holds: halves
/// and numbered (fiscal) periods; "fiscal" may stand beside them ("Fiscal period").
const UNPLACED_PARTS: [&str; 5] = ["half", "semester", "period", "periode", "periodo"];

/// Header words of a period column that may hold a month or a quarter written out ("Jan",
/// "Q1" under "Period").
const PERIOD_PART_WORDS: [&str; 3] = ["period", "periode", "periodo"];

/// Whether every cell is a whole number from 1 to 53: periods or weeks counted within a year.
fn numbered_within_a_year(filled: &[(usize, &str)]) -> bool {
    filled
        .iter()
        .all(|(_, c)| c.trim().parse::<u32>().is_ok_and(|n| (1..=53).contains(&n)))
}

/// Beside a year column, a column named as a part of the year ([`YearPart::words`], or halves
/// and numbered periods) whose cells neither join the year into periods nor read as periods
/// themselves: the error at its first such row. Left alone, its cells would be read as the
/// names of yearly items ("Qtr 1" to "Qtr 4", "P01" to "P13"), a silent misread.
fn unread_part(table: &Table, rows: &[&Record], year: usize) -> Option<RowError> {
    table.header.as_ref()?;
    (0..table.width).filter(|j| *j != year).find_map(|j| {
        let name = table.column_name(j);
        let part = YearPart::ALL
            .into_iter()
            .find(|part| header_is_only(&name, part.words()));
        let unplaced = part.is_none()
            && header_is_only(&name, &[&UNPLACED_PARTS[..], &["fiscal"]].concat())
            && header_says(&name, &UNPLACED_PARTS);
        if part.is_none() && !unplaced {
            return None;
        }
        let cells = table.column(j, rows);
        let filled: Vec<(usize, &str)> = cells
            .iter()
            .enumerate()
            .filter(|(_, c)| !c.trim().is_empty())
            .map(|(i, c)| (i, *c))
            .collect();
        // Only text that would be read as item names: a column of numbers is read (or
        // refused) as numbers are ("Qtr 1" across the header, a period count beside a
        // decimal time), and cells that read as periods by themselves make this column the
        // period's.
        let text = filled
            .iter()
            .filter(|(_, c)| c.chars().any(char::is_alphabetic) && parse_label(c).is_none())
            .count();
        // One text on every row ("Full year") labels the table, not parts of years.
        let one_text = filled.iter().all(|(_, c)| c.trim() == filled[0].1.trim());
        // Numbered periods 1 to 13 (or weeks to 53) under "Period" or "Half" count within a
        // year as no calendar does: they had been left out as calendar details and the rows
        // of a year summed into one yearly period (a review, 2026-12-04).
        // A column counting the rows (1, 2, 3, ...) places them instead, the year and this
        // column then calendar details (a published file: t, year, period, time, value).
        let counted = || {
            (0..table.width).filter(|k| *k != year && *k != j).any(|k| {
                integer_meaning(&table.column(k, rows), true) == Some(IntegerMeaning::Positions)
            })
        };
        let numbered = unplaced && !one_text && numbered_within_a_year(&filled) && !counted();
        if filled.is_empty() || (text * 2 <= filled.len() && !numbered) || one_text {
            return None;
        }
        let (at, text) = match part {
            Some(how) => {
                let split = SplitPeriod {
                    year,
                    part: j,
                    how,
                    day: None,
                };
                let labels = split.labels(rows);
                let bad = filled.iter().find(|(i, _)| {
                    parse_label(&labels[*i]).is_none_or(|l| l.family() != how.family())
                })?;
                *bad
            }
            None => filled[0],
        };
        let message = match part {
            Some(how) => format!(
                "expected {} beside the year in column \"{}\"",
                how.forms(),
                table.column_name(year)
            ),
            None => format!(
                "expected a month, quarter or week beside the year in column \"{}\": \
                 halves and periods numbered within a year (P01 to P13, as four-week periods) \
                 cannot be placed on the calendar; write each row's period as a calendar month \
                 or a date (the period's first day), or, if they are calendar months, name the \
                 column \"month\" (ISO weeks: \"week\")",
                table.column_name(year)
            ),
        };
        Some(RowError {
            row: rows[at].line,
            column: name,
            text: text.trim().to_string(),
            message,
        })
    })
}

/// A year column that counts fiscal years though its header says only "Year": in file order,
/// an item's months within one year go past December into January (Apr, ..., Dec, Jan, ...,
/// Mar), as a fiscal year's do. Read as calendar years, January to March would be put a year
/// away from their neighbours and the rows sorted into a wrong history, said only as rows out
/// of order (a review's fiscal export, 2026-12-05). Which calendar year each month falls in
/// depends on how the company names its fiscal years, so the table is refused at the first
/// January-side row with how to write it. An item's rows are those sharing every cell with a
/// letter outside the period's columns (its name), taken in file order whether the table
/// runs item by item or period by period; a run is its rows in a row with one year. Only where
/// some run turns over once, from November or December to January or February, no run turns
/// more than once (rows in no order at all: sorted, as before, and said), and no run holds
/// both ends of a calendar year in order (a review found one January added late to a calendar
/// file refused: every year of a fiscal file that reaches January turns). A run going newest
/// first is read backwards (a review found fiscal years listed newest first misread).
fn fiscal_order(table: &Table, rows: &[&Record], split: &SplitPeriod) -> Option<RowError> {
    let periods = split.columns();
    // Cells are trimmed when read, so they compare as they stand.
    fn cell(row: &Record, j: usize) -> &str {
        row.cells.get(j).map_or("", String::as_str)
    }
    let mut items: Vec<Vec<usize>> = Vec::new();
    let mut item_of: HashMap<Vec<&str>, usize> = HashMap::new();
    for (i, row) in rows.iter().enumerate() {
        let name: Vec<&str> = (0..table.width)
            .filter(|j| !periods.contains(j))
            .map(|j| cell(row, j))
            .filter(|c| c.chars().any(char::is_alphabetic))
            .collect();
        let next = items.len();
        let k = *item_of.entry(name).or_insert(next);
        if k == next {
            items.push(Vec::new());
        }
        items[k].push(i);
    }
    let month = |i: usize| match parse_label(&split.label(|j| cell(rows[i], j))) {
        Some(Label::Month { month, .. }) | Some(Label::Date { month, .. }) => {
            Some(month).filter(|m| (1..=12).contains(m))
        }
        _ => None,
    };
    let mut turned_at: Option<usize> = None;
    for item in &items {
        for run in item.chunk_by(|a, b| cell(rows[*a], split.year) == cell(rows[*b], split.year)) {
            // The run's months in the order they first appear, with the row of each.
            let mut seen = [false; 13];
            let mut months: Vec<(u32, usize)> = run
                .iter()
                .filter_map(|&i| Some((month(i)?, i)))
                .filter(|(m, _)| !std::mem::replace(&mut seen[*m as usize], true))
                .collect();
            // Newest first (an export listing the latest month at the top): read backwards.
            let falls = months.windows(2).filter(|w| w[1].0 < w[0].0).count();
            if falls * 2 > months.len() {
                months.reverse();
            }
            let turns: Vec<usize> = (1..months.len())
                .filter(|&k| months[k].0 < months[k - 1].0)
                .collect();
            let spans_new_year =
                months.iter().any(|m| m.0 >= 11) && months.iter().any(|m| m.0 <= 2);
            match turns.as_slice() {
                // A calendar year from January to December beside: the turn elsewhere is a
                // row out of place (a January added late), not a fiscal year.
                [] if spans_new_year => return None,
                [] => {}
                [k] if months[*k - 1].0 >= 11
                    && months[*k].0 <= 2
                    && months.last().is_some_and(|last| last.0 < months[0].0) =>
                {
                    let at = months[*k].1;
                    turned_at = Some(turned_at.map_or(at, |t: usize| t.min(at)));
                }
                _ => return None,
            }
        }
    }
    let row = rows[turned_at?];
    let year = table.column_name(split.year);
    Some(RowError {
        row: row.line,
        column: year.clone(),
        text: split.label(|j| cell(row, j)),
        message: format!(
            "expected calendar years in the column \"{year}\": here an item's months within one \
             year run on past December into January, as a fiscal year's do, so the year is not \
             the calendar year of every row; write each period as a calendar month (e.g. \
             2024-01) or a date (if the year is the calendar year, put the rows in time order)"
        ),
    })
}
