//! Intake: the formats it reads, where it says a problem is, and what holds whatever the text.

mod errors;
mod everyday;
mod expect;
mod exports;
mod formats;
mod last_period;
mod misreads;
mod robustness;
mod sales_reports;
mod stock_matching;
mod stock_table;
mod till_exports;
mod unnamed;
mod workbooks;
mod working_days;
mod year_grid;
mod year_parts;
