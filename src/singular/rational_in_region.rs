//! The part of an exact rational analysis that lies in a region: poles, zeros
//! and removable points inside, those on the boundary set apart, and the
//! count zeros − poles inside (with multiplicity).
//!
//! Method: the winding number of the region's boundary about each point
//! (`contour::Contour::winding_number`, exact for the contract's shapes);
//! `None` — on the boundary — is reported, never guessed. The count is what
//! the argument principle gives for the same region (common practice).
//!
//! ```
//! use residuary::contour::Contour;
//! use residuary::singular::{rational_in_region::in_region, rational_poles::analyse_rational};
//! use residuary::C;
//! // (z − 0.5)/(z (z − 3)): inside |z| = 1 one zero and one pole.
//! let num = [C::new(-0.5, 0.0), C::new(1.0, 0.0)];
//! let den = [C::new(0.0, 0.0), C::new(-3.0, 0.0), C::new(1.0, 0.0)];
//! let a = analyse_rational(&num, &den).unwrap();
//! let part = in_region(&a, &Contour::circle(C::new(0.0, 0.0), 1.0));
//! assert_eq!((part.poles.len(), part.zeros.len(), part.zeros_minus_poles), (1, 1, 0));
//! ```

use super::rational_poles::{PoleInfo, RationalAnalysis, ZeroInfo};
use crate::contour::Contour;
use crate::C;

/// The analysis restricted to a region.
#[derive(Debug, Clone, PartialEq)]
pub struct InRegion<'a> {
    pub poles: Vec<&'a PoleInfo>,
    pub zeros: Vec<&'a ZeroInfo>,
    pub removable: Vec<C>,
    /// ("pole" or "zero", location) of the points on the boundary, left out.
    pub on_boundary: Vec<(&'static str, C)>,
    /// Zeros − poles inside, with multiplicity.
    pub zeros_minus_poles: i64,
}

/// Restrict `a` to `region`.
pub fn in_region<'a>(a: &'a RationalAnalysis, region: &Contour) -> InRegion<'a> {
    let inside = |z: C| region.winding_number(z).map(|w| w != 0);
    let mut out = InRegion { poles: Vec::new(), zeros: Vec::new(), removable: Vec::new(), on_boundary: Vec::new(), zeros_minus_poles: 0 };
    for p in &a.poles {
        match inside(p.at) {
            Some(true) => {
                out.zeros_minus_poles -= p.order as i64;
                out.poles.push(p);
            }
            Some(false) => {}
            None => out.on_boundary.push(("pole", p.at)),
        }
    }
    for z in &a.zeros {
        match inside(z.at) {
            Some(true) => {
                out.zeros_minus_poles += z.order as i64;
                out.zeros.push(z);
            }
            Some(false) => {}
            None => out.on_boundary.push(("zero", z.at)),
        }
    }
    out.removable = a.removable.iter().filter(|r| inside(r.at) == Some(true)).map(|r| r.at).collect();
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::sampled_winding;
    use crate::singular::rational_poles::analyse_rational;

    #[test]
    fn agrees_with_the_sampled_winding_of_a_polygon() {
        // Poles at ±1 and 2i, zero at 0.5 (by construction); a square of side 3 about 0.
        let num = crate::poly::from_roots(C::new(1.0, 0.0), &[C::new(0.5, 0.0)]);
        let den = crate::poly::from_roots(C::new(1.0, 0.0), &[C::new(1.0, 0.0), C::new(-1.0, 0.0), C::new(0.0, 2.0)]);
        let a = analyse_rational(&num, &den).unwrap();
        let square = [C::new(-1.5, -1.5), C::new(1.5, -1.5), C::new(1.5, 1.5), C::new(-1.5, 1.5)];
        let part = in_region(&a, &Contour::Polygon { vertices: square.iter().map(|z| [z.re, z.im]).collect() });
        // Slow reference: count by the summed argument change about each point.
        let want = sampled_winding(&square, C::new(0.5, 0.0))
            - [C::new(1.0, 0.0), C::new(-1.0, 0.0), C::new(0.0, 2.0)].iter().map(|&p| sampled_winding(&square, p)).sum::<i32>();
        assert_eq!(part.zeros_minus_poles, want as i64);
        assert_eq!(part.poles.len(), 2);
        let on = in_region(&a, &Contour::circle(C::new(0.0, 0.0), 1.0));
        assert_eq!(on.on_boundary.len(), 2, "the poles at ±1 lie on |z| = 1");
    }
}
