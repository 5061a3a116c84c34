//! Stage 7, optimise: how many wells, pumping how much, so that every check point is at or below
//! its target without asking any well for more than it can give.
//!
//! `lp` (a small linear-programme layer, with `clarabel` as the second solver) and `limits` (what one well may give) → `rates` (one
//! layout's field and unit rows) → `uniform` and `individual` (the two rate options) → `trial`
//! (one layout tried) → `precheck` (reasons nothing can work) and `search` (the fewest wells,
//! `drydig design`; `search_range`: where it starts, the cap on wells; `choice`: the layout
//! chosen from what it found) → `outcome` (how it ended, whether it is met); the bid's quantities are in
//! [`crate::bid`];
//! `sweep` (a range of counts or spacings) and `recharge` (sizing recharge wells for neighbours).
//! `one_out` (the rows for any one well out of service), `standby` (finishing a met design:
//! idle wells dropped, the worst loss, standby wells placed) and `pumps` (pump classes, heads
//! and power for the bid). `placement` finds the fewest wells on candidate positions (LP
//! relaxation, rounding and greedy removal), beside the evenly spaced rings of `search`.

pub mod binding;
pub mod choice;
pub mod clarabel;
pub mod design_notes;
pub mod individual;
pub mod limits;
pub mod lp;
pub mod lp_problem;
pub mod one_out;
pub mod outcome;
pub mod placement;
pub mod precheck;
pub mod pumps;
pub mod rates;
pub mod recharge;
pub mod recharge_notes;
pub mod rolling;
pub mod search;
pub mod search_range;
pub mod standby;
pub mod sweep;
pub mod trial;
pub mod uniform;
