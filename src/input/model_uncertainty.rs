//! Uncertain inputs in the model: each a distribution in SI, the rank correlation of K and S,
//! and the sampling settings.
//!
//! Hydraulic conductivity is usually taken as lognormal: measured K of one formation spreads
//! over orders of magnitude and its logarithm is close to normally distributed (Freeze, R. A.,
//! 1975, "A stochastic-conceptual analysis of one-dimensional groundwater flow in nonuniform
//! homogeneous media", Water Resources Research 11(5), 725–741; also Gelhar, L. W., 1993,
//! Stochastic Subsurface Hydrology, Prentice Hall, ch. 1). A lognormal is written here by its
//! median and its *factor*, the geometric standard deviation exp(σ_ln): about two samples in
//! three lie between median ÷ factor and median × factor.

use spec_math::cephes64::ndtri;

/// A distribution of one input, in SI.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Distribution {
    /// ln X normal with median `median` and σ_ln = ln(`factor`).
    Lognormal {
        /// Median (= geometric mean), SI.
        median: f64,
        /// Geometric standard deviation exp(σ_ln), > 1.
        factor: f64,
    },
    /// Uniform between `low` and `high`.
    Uniform {
        /// Lowest, SI.
        low: f64,
        /// Highest, SI.
        high: f64,
    },
    /// Triangular: `low`, `mode`, `high`.
    Triangular {
        /// Lowest, SI.
        low: f64,
        /// Most likely, SI.
        mode: f64,
        /// Highest, SI.
        high: f64,
    },
}

impl Distribution {
    /// The value with non-exceedance probability `u` (0 < u < 1): the inverse CDF.
    ///
    /// Lognormal: median·factor^Φ⁻¹(u) (Φ⁻¹ by Cephes `ndtri`); uniform: low + u·(high − low);
    /// triangular: low + √(u·(high − low)(mode − low)) for u ≤ F(mode), else
    /// high − √((1 − u)(high − low)(high − mode)) (Evans, Hastings & Peacock, Statistical
    /// Distributions, 3rd ed., Wiley 2000, ch. 40).
    pub fn quantile(&self, u: f64) -> f64 {
        let u = u.clamp(1e-12, 1.0 - 1e-12);
        match *self {
            Distribution::Lognormal { median, factor } => median * factor.powf(ndtri(u)),
            Distribution::Uniform { low, high } => low + u * (high - low),
            Distribution::Triangular { low, mode, high } => {
                let span = high - low;
                if span <= 0.0 {
                    return low;
                }
                let f_mode = (mode - low) / span;
                if u <= f_mode {
                    low + (u * span * (mode - low)).sqrt()
                } else {
                    high - ((1.0 - u) * span * (high - mode)).sqrt()
                }
            }
        }
    }

    /// The median (P50).
    pub fn median(&self) -> f64 {
        self.quantile(0.5)
    }
}

/// Which input of the model a distribution replaces.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum InputKind {
    /// Hydraulic conductivity K, m/s.
    Conductivity,
    /// Transmissivity T, m²/s (K = T / initial saturated thickness).
    Transmissivity,
    /// Specific yield S_y.
    SpecificYield,
    /// Storativity S.
    Storativity,
    /// Sichardt's C (radial; the line value scales with it).
    SichardtC,
    /// Fixed distance of influence, m.
    Distance,
    /// Groundwater level before pumping, m.
    GroundwaterLevel,
    /// Aquitard resistance c, s.
    AquitardResistance,
    /// Anisotropy K_v/K_h.
    Anisotropy,
    /// Factor on every neighbour layer's m_v, C_c and C_r.
    CompressibilityFactor,
}

impl InputKind {
    /// The field name in `[uncertainty]` (and the CSV column stem).
    pub fn field(self) -> &'static str {
        match self {
            InputKind::Conductivity => "conductivity",
            InputKind::Transmissivity => "transmissivity",
            InputKind::SpecificYield => "specific_yield",
            InputKind::Storativity => "storativity",
            InputKind::SichardtC => "sichardt_c",
            InputKind::Distance => "distance",
            InputKind::GroundwaterLevel => "groundwater_level",
            InputKind::AquitardResistance => "aquitard_resistance",
            InputKind::Anisotropy => "anisotropy",
            InputKind::CompressibilityFactor => "compressibility_factor",
        }
    }

    /// The SI unit of the machine column ("" for no unit).
    pub fn si_unit(self) -> &'static str {
        match self {
            InputKind::Conductivity => "m/s",
            InputKind::Transmissivity => "m2/s",
            InputKind::Distance | InputKind::GroundwaterLevel => "m",
            InputKind::AquitardResistance => "s",
            _ => "",
        }
    }

    /// K or T: the input a rank correlation with S refers to.
    pub fn is_permeability(self) -> bool {
        matches!(self, InputKind::Conductivity | InputKind::Transmissivity)
    }

    /// S_y or S.
    pub fn is_storage(self) -> bool {
        matches!(self, InputKind::SpecificYield | InputKind::Storativity)
    }
}

/// One uncertain input.
#[derive(Debug, Clone)]
pub struct UncertainInput {
    /// What it replaces.
    pub kind: InputKind,
    /// Its distribution, SI.
    pub distribution: Distribution,
    /// As written in the design file, for reports.
    pub text: String,
}

/// `[uncertainty]`, validated.
#[derive(Debug, Clone)]
pub struct Uncertainty {
    /// The uncertain inputs, in the order of [`InputKind`].
    pub inputs: Vec<UncertainInput>,
    /// Spearman rank correlation between K (or T) and S_y (or S), when given.
    pub rank_correlation: Option<f64>,
    /// Number of samples.
    pub samples: usize,
    /// Seed.
    pub seed: u64,
}

/// Default number of samples.
pub const DEFAULT_SAMPLES: usize = 1000;
/// Default seed.
pub const DEFAULT_SEED: u64 = 1;
/// Most samples accepted (the CSV stays readable and a run stays in minutes).
pub const MAX_SAMPLES: usize = 100_000;

#[cfg(test)]
mod tests {
    use super::*;

    /// Triangular and uniform quantiles at known points (Evans, Hastings & Peacock 2000,
    /// ch. 40: F(mode) = (mode − low)/(high − low)); the lognormal median·factor at
    /// Φ⁻¹(0.8413447) = 1 (standard normal table, from memory).
    #[test]
    fn quantiles() {
        let t = Distribution::Triangular {
            low: 0.0,
            mode: 1.0,
            high: 4.0,
        };
        assert!((t.quantile(0.25) - 1.0).abs() < 1e-12);
        assert!((t.quantile(0.25 / 2.0) - 0.5f64.sqrt()).abs() < 1e-12);
        let u = Distribution::Uniform {
            low: 2.0,
            high: 6.0,
        };
        assert!((u.quantile(0.75) - 5.0).abs() < 1e-12);
        let l = Distribution::Lognormal {
            median: 2e-4,
            factor: 3.0,
        };
        assert!((l.quantile(0.841_344_746) / 6e-4 - 1.0).abs() < 1e-6);
        assert!((l.median() / 2e-4 - 1.0).abs() < 1e-12);
    }
}
