//! Singularities of general (non-rational) meromorphic functions given as
//! closures: counting (argument principle), locating (AAA + Newton),
//! residues (trapezoidal rule on circles), classification of points
//! (pole, removable, regular, essential, branch point), and infinity; and
//! exact analysis of rational functions (`rational_poles`).

pub mod aaa;
pub mod argument_principle;
pub mod branch_jump;
pub mod classify;
pub mod cut_crossing;
pub mod decay;
pub mod meromorphic;
pub mod newton_refine;
pub mod rational_check;
pub mod rational_in_region;
pub mod rational_poles;
pub mod region_search;
pub mod removable;
pub mod residue_trapezoid;

pub use argument_principle::count_by_argument_principle;
pub use classify::{classify_infinity, classify_point};
pub use meromorphic::find_singularities;

use crate::budget::Budget;
use crate::error::Failure;
use crate::C;

/// What symbolic analysis of the expression knows in advance (may be empty).
#[derive(Debug, Clone, Default)]
pub struct Hints {
    /// Points that may be essential singularities (e.g. a where exp(1/(z−a)) occurs).
    pub essential_candidates: Vec<C>,
    /// Points that may be branch points (e.g. zeros of the argument of sqrt/log/powers).
    pub branch_candidates: Vec<C>,
    /// True when the expression contains sqrt, log, non-integer powers, ...
    /// When false, classification skips the scan for branch cuts (f is then
    /// single-valued), which halves its cost; callers that pass closures with
    /// cuts must set it.
    pub uses_branch_functions: bool,
    /// True when poles of f accumulate at infinity (tan, sec, gamma, … of a growing
    /// argument): infinity is then not an isolated singularity.
    pub poles_accumulate_at_infinity: bool,
}

/// The kind of a point.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    Pole,
    Removable,
    Regular,
    Essential,
    BranchPoint,
}

impl Kind {
    /// The contract's name for the kind.
    pub fn name(self) -> &'static str {
        match self {
            Kind::Pole => "pole",
            Kind::Removable => "removable",
            Kind::Regular => "regular",
            Kind::Essential => "essential",
            Kind::BranchPoint => "branch_point",
        }
    }
}

/// The classification of one point (finite, or infinity).
#[derive(Debug, Clone, PartialEq)]
pub struct PointResult {
    pub kind: Kind,
    /// Pole order (poles only).
    pub order: Option<u32>,
    /// Residue; `None` when it does not exist (branch point, non-isolated singularity).
    pub residue: Option<C>,
    /// Laurent coefficients c₋₁, c₋₂, … (for a pole: exactly `order` of them;
    /// for an essential singularity: the first few; otherwise empty).
    /// At infinity: the coefficients of f(1/w) at w = 0.
    pub principal_part: Vec<C>,
    /// Bound on |computed residue − true residue| (0 when there is no residue).
    pub error_estimate: f64,
    /// Things the caller should tell the user (never silently dropped).
    pub warnings: Vec<String>,
}

/// A located zero or pole.
#[derive(Debug, Clone, PartialEq)]
pub struct Found {
    pub at: C,
    pub order: u32,
    /// Residue (poles only).
    pub residue: Option<C>,
    /// For poles: bound on the residue error; for zeros: estimate of the location error.
    pub error_estimate: f64,
    /// Poles: Laurent coefficients c₋₁, c₋₂, …, c₋ₘ (m = order); zeros: empty.
    pub principal_part: Vec<C>,
}

/// Everything found inside a region.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct RegionResult {
    pub poles: Vec<Found>,
    pub zeros: Vec<Found>,
    pub essential: Vec<C>,
    pub branch_points: Vec<C>,
    /// N − P from the argument principle along the region's boundary (when a
    /// branch cut crosses the boundary, so that it cannot be counted: the
    /// net order of what was found, and `boundary_count` is `None`).
    pub zeros_minus_poles: i64,
    /// N − P by the argument principle, `None` when a cut crossing the boundary prevented it.
    pub boundary_count: Option<i64>,
    pub warnings: Vec<String>,
}

/// Evaluate f at z, charging one evaluation to the budget.
pub(crate) fn eval(f: &dyn Fn(C) -> C, z: C, budget: &mut Budget) -> Result<C, Failure> {
    budget.spend(1)?;
    Ok(f(z))
}

pub(crate) fn is_finite(z: C) -> bool {
    z.re.is_finite() && z.im.is_finite()
}

pub(crate) use crate::text::place as show;
