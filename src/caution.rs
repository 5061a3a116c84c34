//! The caution every output carries: terminal, files, maps and reports.

/// The caution carried by every output: terminal, files and maps.
pub const CAUTION: &str = "Screening design by analytical methods under idealised ground \
(homogeneous, isotropic, steady unless stated). Confirm with site investigation and pumping \
tests. Final design, monitoring and discharge permits are for a licensed professional under \
local codes and regulations. Dewatering can settle and damage nearby structures and services.";
