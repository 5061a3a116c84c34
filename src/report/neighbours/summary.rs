//! The neighbours' part of `summary.json`: the rule-of-thumb limits (settlement, angular
//! distortion and their label) used where the design file gives a building none.

use crate::safety::neighbours::{
    RULE_OF_THUMB_DISTORTION, RULE_OF_THUMB_LABEL, RULE_OF_THUMB_SETTLEMENT,
};
use serde_json::{json, Value};

/// The rule-of-thumb limits, for `summary.json`.
pub fn rules_of_thumb() -> Value {
    json!({
        "settlement_m": RULE_OF_THUMB_SETTLEMENT,
        "angular_distortion": RULE_OF_THUMB_DISTORTION,
        "label": RULE_OF_THUMB_LABEL,
    })
}
