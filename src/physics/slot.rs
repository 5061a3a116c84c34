//! Steady flow to a line slot (trench, line of closely spaced wellpoints), per metre of length.
//!
//! One-dimensional Darcy (confined) and Dupuit (unconfined) flow from a line source at the
//! distance of influence L to the slot. Units: K in m/s, heads and thickness in m above the
//! aquifer base, L in m → q in m³/s per metre of slot. Near the ends of a finite slot inflow is
//! larger than these formulas give (US Army TM 5-818-5, published text).

/// Whether water reaches the slot from one side or from both.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SlotSides {
    /// Flow from one side only (e.g. a slot along a cut-off wall or a river bank).
    One,
    /// Flow from both sides (a trench in open ground): twice the one-sided flow.
    Both,
}

impl SlotSides {
    /// Multiplier on the one-sided flow: 1 for [`SlotSides::One`], 2 for [`SlotSides::Both`].
    pub fn factor(self) -> f64 {
        match self {
            SlotSides::One => 1.0,
            SlotSides::Both => 2.0,
        }
    }
}

/// Confined flow to a slot, per metre: q = K·D·(H − h)/L per side.
///
/// Units: K m/s, D (aquifer thickness) m, H (head at distance L) and h (head at the slot) m,
/// L m → q in m³/s per m. Source: Darcy's law in one dimension; presented in US Army
/// TM 5-818-5, Fig. 4-1 (from memory).
pub fn slot_flow_confined(
    k: f64,
    thickness: f64,
    head_far: f64,
    head_at_slot: f64,
    distance_of_influence: f64,
    sides: SlotSides,
) -> f64 {
    sides.factor() * k * thickness * (head_far - head_at_slot) / distance_of_influence
}

/// Unconfined (Dupuit) flow to a slot, per metre: q = K·(H² − h²)/(2L) per side.
///
/// Units: K m/s, H and h m above the aquifer base, L m → q in m³/s per m. Source: Dupuit (1863);
/// presented in US Army TM 5-818-5, Fig. 4-1 (from memory).
pub fn slot_flow_unconfined(
    k: f64,
    head_far: f64,
    head_at_slot: f64,
    distance_of_influence: f64,
    sides: SlotSides,
) -> f64 {
    sides.factor() * k * (head_far * head_far - head_at_slot * head_at_slot)
        / (2.0 * distance_of_influence)
}

/// Flow to a slot from Strack's discharge potential, per metre: q = (Φ₀ − Φ)/L per side.
///
/// Φ (m³/s per m) is Strack's discharge potential: Φ = K·b·h − ½K·b² where confined (h ≥ b),
/// Φ = ½K·h² where unconfined (h < b), h above the aquifer base. The one formula therefore
/// covers an aquifer that turns unconfined near the slot. Source: Strack (1989),
/// *Groundwater Mechanics*, ch. 1 and 2 (one-dimensional flow). L in m → q in m³/s per m.
pub fn slot_flow_from_potentials(
    potential_far: f64,
    potential_at_slot: f64,
    distance_of_influence: f64,
    sides: SlotSides,
) -> f64 {
    sides.factor() * (potential_far - potential_at_slot) / distance_of_influence
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Strack (1989) discharge potential, written out here from design.md §2 for the test
    /// (confined Φ = K·b·h − ½K·b², unconfined Φ = ½K·h²).
    fn strack_potential(k: f64, b: f64, h: f64) -> f64 {
        if h >= b {
            k * b * h - 0.5 * k * b * b
        } else {
            0.5 * k * h * h
        }
    }

    #[test]
    fn trench_values() {
        // TM 5-818-5, Fig. 4-1 (from memory), values in checks.md §7: K = 1e-4, D = H = 10,
        // h = 2, L = 100 → confined 8.0e-5, unconfined 4.8e-5 m³/s per metre (one side)
        let conf = slot_flow_confined(1e-4, 10.0, 10.0, 2.0, 100.0, SlotSides::One);
        let unconf = slot_flow_unconfined(1e-4, 10.0, 2.0, 100.0, SlotSides::One);
        assert_relative_eq!(conf, 8.0e-5, max_relative = 1e-12);
        assert_relative_eq!(unconf, 4.8e-5, max_relative = 1e-12);
        // both sides double it (checks.md §7)
        let both = slot_flow_unconfined(1e-4, 10.0, 2.0, 100.0, SlotSides::Both);
        assert_relative_eq!(both, 9.6e-5, max_relative = 1e-12);
        let both = slot_flow_confined(1e-4, 10.0, 10.0, 2.0, 100.0, SlotSides::Both);
        assert_relative_eq!(both, 1.6e-4, max_relative = 1e-12);
    }

    #[test]
    fn potentials_reproduce_both_forms() {
        // Strack (1989), Groundwater Mechanics: with h < b throughout, the potential form gives
        // the unconfined value 4.8e-5 (checks.md §7)
        let k = 1e-4;
        let q = slot_flow_from_potentials(
            strack_potential(k, 10.0, 10.0),
            strack_potential(k, 10.0, 2.0),
            100.0,
            SlotSides::One,
        );
        assert_relative_eq!(q, 4.8e-5, max_relative = 1e-12);
        // confined throughout (b = 10, H = 20, h = 12): K·b·(H − h)/L = 1e-4·10·8/100 = 8.0e-5
        // (the confined value of checks.md §7 with the same head difference)
        let q = slot_flow_from_potentials(
            strack_potential(k, 10.0, 20.0),
            strack_potential(k, 10.0, 12.0),
            100.0,
            SlotSides::One,
        );
        assert_relative_eq!(q, 8.0e-5, max_relative = 1e-12);
        // confined far, unconfined at the slot (b = 10, H = 14, h = 6): Strack's combined form
        // gives K·(b·H − b²/2 − h²/2)/L = 1e-4·(140 − 50 − 18)/100 = 7.2e-5 (hand arithmetic)
        let q = slot_flow_from_potentials(
            strack_potential(k, 10.0, 14.0),
            strack_potential(k, 10.0, 6.0),
            100.0,
            SlotSides::Both,
        );
        assert_relative_eq!(q, 2.0 * 7.2e-5, max_relative = 1e-12);
    }
}
