//! A year down and its months or quarters across: `Item,Year,Jan,Feb,...,Dec` with a row per
//! item and year, the way many small shops keep their sales in a spreadsheet (common
//! practice). Each cell's period is its row's year with its column's month or quarter.
//!
//! Kept apart from: finding the other layouts ([`super::table::plan`] asks [`YearGrid::find`]
//! before it refuses other grids with the calendar across, [`super::shapes::calendar_grid`])
//! and reading the cells (the builder's `year_grid`, with the same number, gap and error rules
//! as every layout).
//!
//! Rule, by the header's words only: a column named as a year ("Year", "Yr") whose cells are
//! mostly years of four digits; number columns headed by the twelve months (names, "Jan.",
//! "M01", "Month 1") or the four quarters ("Q1", "Qtr 1", "Quarter 1", "1st Qtr"), all of one
//! kind, each once, in calendar order; left of them, columns naming the items (text, or codes
//! under a header naming items: "SKU"); right of them anything (a total, notes: not read,
//! said), and a row total anywhere ("Total"). Anything else (a price among the months, a
//! second date, months missing or in a fiscal year's order) is not this layout: such grids
//! stay refused with what to write instead; the whole year's months across beside items with
//! no year anywhere (`Item,Jan,...,Dec`) are refused saying to add the year
//! ([`without_a_year`]). Weeks, halves and numbered accounting periods
//! across are not read (weeks 1 to 53 rarely stand as columns, and the others cannot be
//! placed on the calendar).

use crate::sorting;
use std::collections::{HashMap, HashSet};

use super::frame::Table;
use super::headers::{header_is_only, header_says};
use super::joined::YearPart;
use super::label::{month_name, year_of};
use super::table::{names_item, whole_number};
use super::text::Record;
use super::words::{month_named, numbered_part, NumberedPart, YEAR_WORDS};
use super::RowError;

/// Header words of a row total beside the months: not a part of the year.
const TOTAL_WORDS: [&str; 6] = ["total", "totals", "sum", "ytd", "annual", "full"];

/// Header words of figures left of the months that are no month's sales and name no item:
/// last year's ("Vorjahr", "LY", "PY"), a budget or target, a change, a rank (a review found
/// such grids refused as calendar grids).
const FIGURES_BESIDE_THE_YEAR: [&str; 9] = [
    "vorjahr", "ly", "py", "budget", "target", "plan", "yoy", "forecast", "rank",
];

/// The columns of a year grid.
#[derive(Clone, Debug, PartialEq, Eq)]
pub(crate) struct YearGrid {
    year: usize,
    across: YearPart,
    /// Each part column with its number within the year, in header order (calendar order).
    parts: Vec<(usize, u32)>,
    /// The columns naming the items: text columns and number columns of codes ("SKU") left of
    /// the months, in header order.
    items: Vec<usize>,
    /// Columns not read: row totals, last year's figures ("Last year"), and whatever stands
    /// right of the last month or quarter (a total, an average, notes).
    ignored: Vec<usize>,
}

impl YearGrid {
    /// Finds a year grid among the number columns `numeric` and the columns read as periods
    /// `periods` (a column of years may be one), beside the text columns `texts` (see the
    /// module doc); `None` when the table is not one.
    pub(crate) fn find(table: &Table, rows: &[&Record], columns: &Columns) -> Option<YearGrid> {
        let &Columns {
            numeric,
            periods,
            texts,
            ..
        } = columns;
        if rows.is_empty() {
            return None;
        }
        let (across, parts) = whole_year(table, columns)?;
        let (first_part, last_part) = (parts.first()?.0, parts.last()?.0);
        // A header naming the calendar year and nothing else: "Last year", "Prior year" and
        // "Year total" hold figures, and a fiscal year's January may fall in either calendar
        // year.
        let is_year = |j: usize| {
            let name = table.column_name(j);
            let years = table
                .column(j, rows)
                .iter()
                .filter(|c| believable_year(c).is_some())
                .count();
            header_is_only(&name, &YEAR_WORDS) && years * 2 > rows.len()
        };
        let mut others: Vec<usize> = numeric
            .iter()
            .chain(periods)
            .chain(texts)
            .copied()
            .filter(|j| !parts.iter().any(|p| p.0 == *j))
            .collect();
        sorting::sort(&mut others);
        let year = others
            .iter()
            .copied()
            .find(|j| *j < first_part && is_year(*j))?;
        let (mut items, mut ignored) = (Vec::new(), Vec::new());
        for j in others.into_iter().filter(|j| *j != year) {
            let name = table.column_name(j);
            // A total, or last year's figures ("Last year", "Prior year") beside the year.
            // Whole words of the header in lower case too: "YoY" splits at its capitals.
            let lower = name.to_lowercase();
            let figures_of_a_year = j < first_part
                && ((header_says(&name, &YEAR_WORDS) && !header_is_only(&name, &YEAR_WORDS))
                    || header_says(&lower, &FIGURES_BESIDE_THE_YEAR));
            if numeric.contains(&j) && (header_says(&name, &TOTAL_WORDS) || figures_of_a_year) {
                ignored.push(j);
            } else if j > last_part && names_a_part(&name) {
                // A month or quarter after the year's last ("Jan (next yr)"): not a column to
                // leave out unread.
                return None;
            } else if j > last_part {
                ignored.push(j);
            } else if periods.contains(&j) {
                // Another column of periods (a date): not this layout.
                return None;
            } else if j < first_part && (texts.contains(&j) || names_item(table, j)) {
                items.push(j);
            } else {
                // A number column before the months that names no item (a price, a store
                // number), or anything among them: not a layout to guess at.
                return None;
            }
        }
        if items.is_empty() || !years_shared(rows, year, &items) {
            return None;
        }
        Some(YearGrid {
            year,
            across,
            parts,
            items,
            ignored,
        })
    }

    /// The year column.
    pub(crate) fn year(&self) -> usize {
        self.year
    }

    pub(crate) fn across(&self) -> YearPart {
        self.across
    }

    /// The part columns with their numbers, in calendar order.
    pub(crate) fn parts(&self) -> &[(usize, u32)] {
        &self.parts
    }

    /// The part columns.
    pub(crate) fn part_columns(&self) -> Vec<usize> {
        self.parts.iter().map(|p| p.0).collect()
    }

    /// The columns naming the items.
    pub(crate) fn items(&self) -> &[usize] {
        &self.items
    }

    /// The columns not read.
    pub(crate) fn ignored(&self) -> &[usize] {
        &self.ignored
    }
}

/// The number (or empty) columns headed by the whole year's months or quarters, each once,
/// in calendar order, with their numbers; `None` when the header holds no such run. With
/// months missing from the header, every year of every item would have gaps to fill. Empty
/// ones count: a sheet of this year alone has its months still to come empty.
fn whole_year(table: &Table, columns: &Columns) -> Option<(YearPart, Vec<(usize, u32)>)> {
    let header = table.header.as_ref()?;
    let mut candidates: Vec<usize> = columns
        .numeric
        .iter()
        .chain(columns.empty)
        .copied()
        .collect();
    sorting::sort(&mut candidates);
    let parts: Vec<(usize, YearPart, u32)> = candidates
        .iter()
        .filter_map(|&j| {
            let cell = header.cells.get(j)?;
            part_of_year(cell).map(|(kind, n)| (j, kind, n))
        })
        .collect();
    let across = parts.first()?.1;
    let whole = parts.iter().map(|p| p.2).eq(1..=across.count());
    (whole && parts.iter().all(|p| p.1 == across))
        .then(|| (across, parts.into_iter().map(|(j, _, n)| (j, n)).collect()))
}

/// The error for the whole year's months (or quarters) across the header beside columns naming
/// items, with no column of years nor any other period: which year each figure is of is
/// nowhere in the table (`Item,Jan,...,Dec`, one year's sheet). It had been refused at the
/// item column as periods written wrongly. `None` for any other table.
pub(crate) fn without_a_year(
    table: &Table,
    rows: &[&Record],
    columns: &Columns,
) -> Option<RowError> {
    let &Columns {
        numeric,
        periods,
        texts,
        ..
    } = columns;
    let header = table.header.as_ref()?;
    let (across, parts) = whole_year(table, columns)?;
    let first = parts.first()?.0;
    // A year named left of the months, by a header naming it and nothing else: "Last year"
    // or "Year total" hold figures (a review found `Item,Last year,Jan,...,Dec` of one row
    // read as a long table of January's figure).
    let named_year = (0..first).any(|j| header_is_only(&table.column_name(j), &YEAR_WORDS));
    if named_year || !texts.iter().any(|j| *j < first) {
        return None;
    }
    // Years under another name ("Season", "Period", "FY"): calendar years or not, only the
    // user knows.
    let years_unnamed = numeric.iter().chain(periods).copied().find(|&j| {
        j < first
            && table
                .column(j, rows)
                .iter()
                .filter(|c| believable_year(c).is_some())
                .count()
                * 2
                > rows.len()
    });
    if !periods.is_empty() && years_unnamed.is_none() {
        return None;
    }
    // Weeks across are never a year grid ([`part_of_year`] names months and quarters).
    let layout = match across {
        YearPart::Quarter => "Item,Year,Q1,Q2,Q3,Q4",
        _ => "Item,Year,Jan,Feb,...,Dec",
    };
    let name = table.column_name(first);
    // At the column the error is about: the one holding years, else the first month.
    let at = years_unnamed.unwrap_or(first);
    let message = match years_unnamed {
        Some(j) => format!(
            "expected a column named \"Year\" beside the {} across the header: column \"{}\" \
             holds years, but its header does not say they are calendar years; if they are, \
             name it \"Year\" ({layout}); a fiscal year's months cannot be placed (write \
             calendar months or dates)",
            across.plural(),
            table.column_name(j)
        ),
        None => format!(
            "expected the year of the {} across the header; none is written: add a column \
             \"Year\" with each row's year, left of the {} ({layout}), or write the year in \
             each header (such as {name} 2024)",
            across.plural(),
            across.plural()
        ),
    };
    let column = table.column_name(at);
    Some(RowError {
        row: header.line,
        column: column.clone(),
        text: column,
        message,
    })
}

/// The columns of a table by their role, as [`super::table::plan`] found them: what a year
/// grid is made of.
pub(crate) struct Columns<'c> {
    /// Columns of numbers (quantities, codes, years).
    pub numeric: &'c [usize],
    /// Columns read as periods (a column of years may be one).
    pub periods: &'c [usize],
    /// Columns of text (item names).
    pub texts: &'c [usize],
    /// Columns with no cell filled.
    pub empty: &'c [usize],
}

/// Whether the items' rows share their years, as a report's rows do: with two items or more,
/// some year is held by at least half of them. Each item in a year of its own ("1978",
/// "2011", "1990") is a column of figures under a year's name (a review found annual totals
/// under "Year" read as each item's own year).
fn years_shared(rows: &[&Record], year: usize, items: &[usize]) -> bool {
    let mut names: HashSet<String> = HashSet::new();
    let mut held: HashMap<i32, HashSet<String>> = HashMap::new();
    for row in rows {
        let name: String = items
            .iter()
            .map(|j| {
                row.cells
                    .get(*j)
                    .map_or("", String::as_str)
                    .trim()
                    .to_lowercase()
            })
            .collect::<Vec<_>>()
            .join("/");
        let Some(y) = row.cells.get(year).and_then(|c| believable_year(c)) else {
            continue;
        };
        names.insert(name.clone());
        held.entry(y).or_default().insert(name);
    }
    let most = held.values().map(HashSet::len).max().unwrap_or(0);
    names.len() < 2 || most * 2 >= names.len()
}

/// The first and last years a year grid's rows may name (our choice: the window two-digit
/// years are read in elsewhere, 1969 to 2068). Four digits outside it are codes or typos
/// ("1001", "2204"): taken for years they had spread an item over centuries of gaps.
const YEARS: std::ops::RangeInclusive<i32> = 1969..=2068;

/// The year a year grid's cell names: four digits within [`YEARS`].
pub(crate) fn believable_year(cell: &str) -> Option<i32> {
    let cell = cell.trim();
    (whole_number(cell) && cell.len() == 4)
        .then(|| year_of(cell))
        .flatten()
        .filter(|y| YEARS.contains(y))
}

/// Whether a header mentions a month or a quarter anywhere ("Jan (next yr)", "Q1 2025").
fn names_a_part(header: &str) -> bool {
    header
        .to_lowercase()
        .split(|c: char| !c.is_alphanumeric())
        .any(|w| month_name(w).is_some() || part_of_year(w).is_some())
}

/// The month or quarter one header cell names, with its number: a month's name or
/// abbreviation ("Jan", "Jan.", "Sept", "January"), "M01", "Month 1", "Mth 1"; "Q1", "Qtr 1",
/// "Quarter 1", "1st Qtr". `None` for anything else.
fn part_of_year(cell: &str) -> Option<(YearPart, u32)> {
    let lower = cell.trim().trim_end_matches('.').to_lowercase();
    // English names, or (a year column beside all twelve in order makes them months) the
    // other languages' ("Januar", "févr.": a review found a German grid read as a long table
    // of January's figures).
    if let Some(month) = month_named(&lower) {
        return Some((YearPart::Month, month));
    }
    match numbered_part(&lower)? {
        (NumberedPart::Month, n) => Some((YearPart::Month, n)),
        (NumberedPart::Quarter, n) => Some((YearPart::Quarter, n)),
        _ => None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A header cell -> the part it names.
    fn check(cell: &str, expected: Option<(YearPart, u32)>) {
        assert_eq!(part_of_year(cell), expected, "{cell:?}");
    }

    #[test]
    fn header_cells_name_months_and_quarters() {
        use YearPart::{Month as Months, Quarter as Quarters};
        check("Jan", Some((Months, 1)));
        check("Sept.", Some((Months, 9)));
        check("December", Some((Months, 12)));
        check("M01", Some((Months, 1)));
        check("Month 12", Some((Months, 12)));
        check("Q4", Some((Quarters, 4)));
        check("Qtr 2", Some((Quarters, 2)));
        check("Quarter 3", Some((Quarters, 3)));
        check("1st Qtr", Some((Quarters, 1)));
        check("Q5", None);
        check("3st Qtr", None);
        check("Q001", None);
        check("M13", None);
        check("Month", None);
        check("W1", None);
        check("P1", None);
        check("Mar 2024", None);
        check("May sales", None);
    }
}
