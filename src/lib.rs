//! Morrowcast in the browser: the page, its charts and its Web Workers (the plan worker that
//! computes plans, the reading worker that reads large texts and workbooks).
//!
//! Kept apart from: the computation (the engine, crates/engine) and the command line
//! (crates/cli). Three parts, cut by responsibility:
//! - [`page`]: the Leptos page (client-side), its state and its browser glue; its pure parts
//!   (settings form, words, exports, chart data) build and are tested natively;
//! - [`chart`]: drawings generic over plotters' `DrawingBackend`, each with a text summary;
//! - [`worker`]: what crosses between page and workers, the workers' logic, and the ask queue
//!   of the page's side, all pure; the gloo-worker glue is wasm only.
//!
//! Arrows: page -> chart, page -> worker, and all three -> the engine; nothing points back.

pub mod chart;
pub mod page;
pub mod worker;
