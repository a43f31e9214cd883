//! The wire boundary: JSON shapes of the command line's contract. (being written)
