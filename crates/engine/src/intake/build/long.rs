//! Long tables (item, period, quantity): rows grouped by item in any order, repeated (item,
//! period) rows summed with a warning, and each item's own run of periods with gaps.
//!
//! Kept apart from: single and wide tables (in [`super`]), where a repeated period is an error.

use std::collections::HashMap;

use super::{count, listing, Builder, LongRow};
use crate::calendar::Period;
use crate::intake::period::PeriodColumn;
use crate::intake::text::Record;
use crate::intake::Item;

impl<'a> Builder<'a> {
    pub(super) fn long(&mut self, kept: &[&'a Record], column: Option<&PeriodColumn>) {
        let value_column = self.plan.values[0];
        let mut order: Vec<String> = Vec::new();
        let mut rows_of: HashMap<String, Vec<LongRow<'a>>> = HashMap::new();
        for (k, row) in kept.iter().enumerate() {
            let parts: Vec<&str> = self
                .plan
                .item_columns
                .iter()
                .map(|j| row.cells.get(*j).map_or("", String::as_str))
                .filter(|c| !c.is_empty())
                .collect();
            if parts.is_empty() {
                let j = self.plan.item_columns[0];
                self.error(
                    row.line,
                    j,
                    "",
                    "expected an item name; this row has none".into(),
                );
                continue;
            }
            let name = parts.join(" / ");
            let next_position = rows_of.get(&name).map_or(1, |r| r.len() as i64 + 1);
            let period = match column {
                Some(col) => match col.periods.get(k).copied().flatten() {
                    Some(p) => p,
                    None => continue,
                },
                None => Period::position(next_position),
            };
            let Ok(value) = self.value(row, value_column) else {
                continue;
            };
            if !rows_of.contains_key(&name) {
                order.push(name.clone());
            }
            rows_of.entry(name).or_default().push((period, value, row));
        }
        let period_column = self.plan.period.map_or(0, |(p, _)| p);
        let mut summed = Vec::new();
        for name in order {
            let mut rows = rows_of.remove(&name).unwrap_or_default();
            rows.sort_by_key(|r| r.0);
            let mut merged: Vec<(Period, Option<f64>, Vec<usize>)> = Vec::new();
            for (period, value, row) in rows {
                match merged.last_mut() {
                    Some(last) if last.0 == period => {
                        last.1 = match (last.1, value) {
                            (Some(a), Some(b)) => Some(a + b),
                            (a, b) => a.or(b),
                        };
                        last.2.push(row.line);
                    }
                    _ => merged.push((period, value, vec![row.line])),
                }
            }
            for (period, value, lines) in merged.iter().filter(|m| m.2.len() > 1) {
                let lines: Vec<String> = lines.iter().map(usize::to_string).collect();
                let total = value.map_or("no value".to_string(), |v| v.to_string());
                summed.push(format!(
                    "\"{name}\" {period} (lines {}, total {total})",
                    lines.join(" and ")
                ));
            }
            let (Some(first), Some(last)) = (merged.first(), merged.last()) else {
                continue;
            };
            let start = first.0;
            let last_line = last.2.last().copied().unwrap_or(0);
            let last_row = kept.iter().find(|r| r.line == last_line).copied();
            let Some(len) = last_row.and_then(|r| self.run(start, last.0, r, period_column)) else {
                continue;
            };
            let mut values = vec![None; len as usize];
            let mut present = vec![false; len as usize];
            for (period, value, _) in &merged {
                let slot = start.steps_to(*period) as usize;
                present[slot] = true;
                values[slot] = *value;
                self.check_negative(&name, *period, *value);
            }
            let missing: Vec<String> = (0..len)
                .filter(|i| !present[*i as usize])
                .map(|i| start.offset(i).to_string())
                .collect();
            self.out.gaps_filled += missing.len();
            self.gap_warning(std::slice::from_ref(&name), &missing);
            if values.iter().all(Option::is_none) {
                continue;
            }
            let periods = (0..len).map(|i| start.offset(i)).collect();
            self.out.items.push(Item {
                name,
                periods,
                values,
            });
        }
        if !summed.is_empty() {
            self.out.warnings.push(format!(
                "{} on several rows, summed: {}",
                count(summed.len(), "(item, period) pair"),
                listing(&summed)
            ));
        }
    }
}
