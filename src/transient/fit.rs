//! Fitting the element's cooling to bench readings (filled below).
