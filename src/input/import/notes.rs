//! What a reader did to a drawing's geometry (units converted, arcs flattened), as data with SI
//! numbers, worded in the output's unit system where it is shown.

use crate::input::units::UnitSystem;

/// One thing a reader did to the geometry it read.
#[derive(Debug, Clone, PartialEq)]
pub enum ReadNote {
    /// The drawing's coordinates were scaled from its own unit.
    UnitsConverted {
        /// The unit's symbol ("mm").
        symbol: &'static str,
        /// The unit's name in words ("millimetres").
        words: &'static str,
        /// Metres in one unit.
        metres: f64,
    },
    /// Arcs on `layer` became `segments` straight segments, each within `tolerance_m` (m) of
    /// its arc.
    ArcsFlattened {
        /// Arcs flattened.
        arcs: usize,
        /// Straight segments they became.
        segments: usize,
        /// The layer read.
        layer: String,
        /// Largest gap between a segment and its arc, m.
        tolerance_m: f64,
    },
    /// A note without a quantity, already in words.
    Said(String),
}

impl ReadNote {
    /// The note in words, quantities in `units`.
    pub fn words(&self, units: UnitSystem) -> String {
        match (self, units) {
            (ReadNote::UnitsConverted { symbol, metres, .. }, UnitSystem::Si) => {
                format!("drawing units {symbol} converted to metres (× {metres})")
            }
            (ReadNote::UnitsConverted { words, metres, .. }, UnitSystem::Us) => format!(
                "drawing in {words} converted to feet (× {:.6})",
                units.length(*metres)
            ),
            (
                ReadNote::ArcsFlattened {
                    arcs,
                    segments,
                    layer,
                    tolerance_m,
                },
                _,
            ) => {
                let within = match units {
                    UnitSystem::Si => format!("{tolerance_m} m"),
                    UnitSystem::Us => format!("{:.3} ft", units.length(*tolerance_m)),
                };
                format!(
                    "{} on layer {layer} flattened into {}, each within {within} of the true arc",
                    crate::plural::count(*arcs, "arc", "arcs"),
                    crate::plural::count(*segments, "straight segment", "straight segments")
                )
            }
            (ReadNote::Said(s), _) => s.clone(),
        }
    }
}

impl std::fmt::Display for ReadNote {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.words(UnitSystem::Si))
    }
}

/// What was read for one field of the design file, from where, and what was done to it.
#[derive(Debug, Clone, PartialEq)]
pub struct ImportNote {
    /// "excavation.outline: outline read from site.dxf, layer EXCAVATION".
    pub read: String,
    /// What the reader did.
    pub did: Vec<ReadNote>,
}

impl ImportNote {
    /// The note in words, quantities in `units`.
    pub fn words(&self, units: UnitSystem) -> String {
        let mut s = self.read.clone();
        for n in &self.did {
            s.push_str("; ");
            s.push_str(&n.words(units));
        }
        s
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn drawing_notes_in_both_unit_systems() {
        // 1 mm = 0.001 m = 0.001/0.3048 ft = 0.003281 ft (NIST SP 811 (2008) App. B).
        let n = ReadNote::UnitsConverted {
            symbol: "mm",
            words: "millimetres",
            metres: 1e-3,
        };
        assert_eq!(
            n.to_string(),
            "drawing units mm converted to metres (× 0.001)"
        );
        assert_eq!(
            n.words(UnitSystem::Us),
            "drawing in millimetres converted to feet (× 0.003281)"
        );
        let a = ReadNote::ArcsFlattened {
            arcs: 2,
            segments: 40,
            layer: "PIT".into(),
            tolerance_m: 0.01,
        };
        assert!(a.to_string().contains("each within 0.01 m of"));
        assert!(a
            .to_string()
            .starts_with("2 arcs on layer PIT flattened into 40 straight segments,"));
        assert!(a.words(UnitSystem::Us).contains("each within 0.033 ft of"));
    }
}
