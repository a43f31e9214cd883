//! Classical decomposition. (Placeholder: being written.)
