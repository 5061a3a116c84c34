//! `[uncertainty]` of the design file as written: each uncertain input as a distribution string
//! with its unit (`"lognormal median 2e-4 m/s, factor 3"`, `"uniform 1e-4 .. 5e-4 m/s"`,
//! `"triangular 1500 3000 3500"`), the rank correlation of K and S, and the sampling settings.
//! [`crate::input::validate::uncertainty`] checks it into [`crate::input::model_uncertainty`].
//! Every value keeps its place in the file (`Spanned`), so an error names its line.

use serde::Deserialize;
use toml::Spanned;

/// `[uncertainty]`
#[derive(Debug, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct UncertaintySection {
    /// Hydraulic conductivity K of the aquifer (a velocity).
    #[serde(default)]
    pub conductivity: Option<Spanned<String>>,
    /// Transmissivity T = K·thickness (instead of `conductivity`).
    #[serde(default)]
    pub transmissivity: Option<Spanned<String>>,
    /// Specific yield S_y (unconfined), no unit.
    #[serde(default)]
    pub specific_yield: Option<Spanned<String>>,
    /// Storativity S (confined, leaky), no unit.
    #[serde(default)]
    pub storativity: Option<Spanned<String>>,
    /// Sichardt's constant C (radial), no unit (as `[influence] sichardt_c`).
    #[serde(default)]
    pub sichardt_c: Option<Spanned<String>>,
    /// The fixed distance of influence (`[influence] method = "fixed"`), a length.
    #[serde(default)]
    pub distance: Option<Spanned<String>>,
    /// Groundwater level before pumping, a level.
    #[serde(default)]
    pub groundwater_level: Option<Spanned<String>>,
    /// Hydraulic resistance c of the aquitard (leaky aquifer), a time.
    #[serde(default)]
    pub aquitard_resistance: Option<Spanned<String>>,
    /// Vertical anisotropy K_v/K_h, no unit.
    #[serde(default)]
    pub anisotropy: Option<Spanned<String>>,
    /// A factor on m_v, C_c and C_r of every neighbour's soil layer, no unit.
    #[serde(default)]
    pub compressibility_factor: Option<Spanned<String>>,
    /// Spearman rank correlation between K (or T) and S_y (or S), −1 … 1.
    #[serde(default)]
    pub rank_correlation: Option<Spanned<f64>>,
    /// Number of samples (default 1 000; `--samples` overrides).
    #[serde(default)]
    pub samples: Option<Spanned<i64>>,
    /// Seed of the sampling (default 1; `--seed` overrides).
    #[serde(default)]
    pub seed: Option<Spanned<i64>>,
}
