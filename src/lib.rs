//! draftwire core library. No I/O, no printing.
pub mod precision;
pub mod roots;
