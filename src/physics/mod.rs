//! Analytical groundwater formulas, one physical idea per module. SI units throughout.
