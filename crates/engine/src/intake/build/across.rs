//! Tables whose periods run across the header ([`crate::intake::Layout::Across`]): the
//! header's period cells are read as one period column would be (errors at the header line,
//! under the cell's own text), the columns put in time order, and each row is one item whose values are
//! read with the same number rules as any other layout (errors at the row, under the period's
//! header). Columns out of time order are sorted, with a warning naming the first (a month typed
//! with the wrong year moves its value elsewhere). An item named on two rows is an error at the second (adding them up could count
//! one thing twice); missing periods between the columns are gaps, named in a warning.
//!
//! Kept apart from: finding such a table ([`crate::intake::across`]) and the other layouts.

use crate::sorting;
use std::collections::HashMap;

use super::{item_parts, period_out_of_run, spaced, Builder, PART_JOIN};
use crate::calendar::Period;
use crate::intake::number::is_missing;
use crate::intake::period::{dotted_month, mostly, read_periods, strong_family, IntegerMeaning};
use crate::intake::text::Record;
use crate::intake::Item;

impl<'a> Builder<'a> {
    pub(super) fn across(&mut self, kept: &[&'a Record]) {
        let Some(header) = self.table.header.as_ref() else {
            return;
        };
        let header_line = header.line;
        let value_columns = self.plan.values.clone();
        let cells: Vec<&str> = value_columns
            .iter()
            .map(|j| header.cells.get(*j).map_or("", String::as_str))
            .collect();
        // Months written 03.2024 are numbers to a cell; across the header they are months.
        let dotted = strong_family(&cells).is_none() && mostly(&cells, dotted_month);
        let read = read_periods(&cells, dotted.then_some(IntegerMeaning::DottedMonths));
        for (i, message) in &read.errors {
            let message = message.replace("this column", "this header");
            self.error(header_line, value_columns[*i], cells[*i], message);
        }
        self.out.warnings.extend(read.warnings.iter().cloned());
        self.out.frequency = Some(read.frequency);
        self.out.date_format = Some(format!("{}, across the header", read.description));
        // The period columns in time order; a period twice is an error at its second column.
        let mut columns: Vec<(Period, usize)> = read
            .periods
            .iter()
            .zip(&value_columns)
            .filter_map(|(p, j)| p.map(|p| (p, *j)))
            .collect();
        let periods: Vec<Period> = columns.iter().map(|c| c.0).collect();
        if let Some((odd, beside)) = period_out_of_run(&periods) {
            let (odd, beside) = (columns[odd], columns[beside]);
            let name = |j: usize| self.table.column_name(j);
            self.out.warnings.push(format!(
                "the header's periods are not in time order (\"{}\", {}, is out of the run of \
                 the columns beside it, such as \"{}\", {}); the columns were put in time order \
                 (check that column's year)",
                name(odd.1),
                odd.0,
                name(beside.1),
                beside.0
            ));
        }
        sorting::sort_by_key(&mut columns, |(p, j)| (*p, *j));
        let mut unique: Vec<(Period, usize)> = Vec::with_capacity(columns.len());
        for (period, j) in columns {
            match unique.last() {
                Some(&(prev, first)) if prev == period => {
                    let first_name = self.table.column_name(first);
                    let text = self.table.column_name(j);
                    self.error(
                        header_line,
                        j,
                        &text,
                        format!(
                            "expected each period once across the header; {period} is also \
                             the column \"{first_name}\": this column was not read"
                        ),
                    );
                }
                _ => unique.push((period, j)),
            }
        }
        let (Some(&(start, _)), Some(&(last, last_column))) = (unique.first(), unique.last())
        else {
            return;
        };
        let steps = start.steps_to(last);
        if steps >= crate::intake::build::MAX_PERIODS {
            let text = self.table.column_name(last_column);
            self.error(
                header_line,
                last_column,
                &text,
                format!(
                    "expected periods within {} steps of the first ({start}); this one is \
                     {steps} steps later: check its year",
                    crate::intake::build::MAX_PERIODS
                ),
            );
            return;
        }
        let len = steps as usize + 1;
        let mut present = vec![false; len];
        for (p, _) in &unique {
            present[start.steps_to(*p) as usize] = true;
        }
        let missing: Vec<String> = (0..len)
            .filter(|i| !present[*i])
            .map(|i| start.offset(i as i64).to_string())
            .collect();
        let item_columns = self.plan.item_columns.clone();
        let mut seen: HashMap<String, usize> = HashMap::new();
        let mut items: Vec<Item> = Vec::new();
        for row in kept {
            let name = item_columns
                .iter()
                .map(|j| row.cells.get(*j).map_or("", String::as_str))
                .filter(|c| !is_missing(c))
                .collect::<Vec<_>>()
                .join(PART_JOIN);
            if name.is_empty() {
                self.no_item_name(row, &item_columns);
                continue;
            }
            let key = spaced(&name);
            if let Some(first) = seen.get(&key) {
                let message = format!(
                    "expected each item on one row; \"{name}\" is also on line {first}: this row \
                     was not read (to add up several rows, use item, period, quantity rows)"
                );
                self.error(row.line, item_columns[0], &name, message);
                continue;
            }
            seen.insert(key, row.line);
            let cells: Vec<(Period, &Record, usize)> =
                unique.iter().map(|(p, j)| (*p, *row, *j)).collect();
            let Some(values) = self.item_values(&name, start, len, &cells) else {
                continue;
            };
            if !self.take_slots(len, &name, row.line, item_columns[0]) {
                continue;
            }
            items.push(Item {
                name,
                periods: (0..len).map(|i| start.offset(i as i64)).collect(),
                values,
                parts: item_parts(row, &item_columns),
            });
        }
        let names: Vec<String> = items.iter().map(|i| i.name.clone()).collect();
        self.out.gaps_filled += missing.len() * items.len();
        self.gap_warning(&names, &missing);
        self.after_the_last(&items);
        self.out.items = items;
    }
}
