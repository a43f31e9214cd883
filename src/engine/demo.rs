//! (being written)
pub fn demo_csv() -> String {
    String::new()
}
