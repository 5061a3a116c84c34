//! Cut-off walls solved with the wells: each wall a string of line-doublet elements
//! ([`crate::physics::line_doublet`]) in every aquifer it cuts, their jumps found at
//! collocation points (Strack 1989, *Groundwater Mechanics*, ch. 6; Bakker & Strack 2003,
//! *Analytic elements for multiaquifer flow*, J. Hydrology 271).
//!
//! Unknowns: the jump μ_ej of the discharge potential across element e in each aquifer j the
//! wall cuts (constant along the element). In mode space (the modes of
//! [`crate::physics::multi_aquifer`], ΔΦ_i = √T_i·Σ_k U_ik·ψ_k) a jump μ_ej is a jump
//! U_jk·μ_ej/√T_j in mode k, so the change in potential of aquifer i at x is
//!
//!   ΔΦ_i(x) = Σ_e Σ_j μ_ej · √(T_i/T_j) · Σ_k U_ik·U_jk·D_k,e(x),
//!
//! D_k,e the doublet of unit jump in mode k (Laplace for the zero mode, K₁(r/λ_k) otherwise).
//! At the midpoint of each element, in each aquifer it cuts, the normal flux obeys
//! ∂ΔΦ_j/∂n = μ_ej/(K_j·c) for a wall of resistance c (s), ∂ΔΦ_j/∂n = 0 when impermeable
//! (flux across the wall = saturated thickness × head difference / c). The wells' own normal
//! derivative (images included) is the right-hand side: the dense system is factorised once and
//! solved for one right-hand side per well of unit rate, so every unit row (the design's LP),
//! level and map reads the wells plus the walls they induce.
//!
//! Straight boundaries (image wells) mirror each element too: a constant-head line gives the
//! mirrored element of opposite jump, a barrier the same jump (first-order images, one per
//! boundary; wells with two or more boundaries keep their higher-order images).

use crate::field::wall_far::{far_value, BlockGeometry, Moments, BLOCK};
use crate::geometry::mirror_point;
use crate::input::model_walls::Wall;
use crate::physics::images::{image_sign, BoundaryKind};
use crate::physics::line_doublet::{doublet, doublet_value, Segment};
use nalgebra::DMatrix;

/// All walls together are cut into about this many elements of equal length (constant jump,
/// collocation at the midpoint); shorter than [`MIN_ELEMENT`] never. Against timml (order-3
/// elements of 2 m) the heads agree to 7e-4 m at 0.25 m elements, 1e-3 m at 0.5 m
/// (tests/walls.rs): the open ends and corners need them short.
const ELEMENTS_PER_WALL_LENGTH: f64 = 600.0;
/// Shortest element, m (a wall under 150 m long is cut into 0.25 m elements).
const MIN_ELEMENT: f64 = 0.25;
/// Step of the central difference for the wells' normal derivative, m.
const DIFF_STEP: f64 = 1e-3;

/// The modes the walls are written in: √T of each aquifer, the eigenvectors U and each mode's
/// leakage factor (`None`: Laplace).
#[derive(Debug, Clone)]
pub struct WallModes {
    /// √T_i (any common scale: only the ratios enter).
    pub sqrt_t: Vec<f64>,
    /// U (aquifer × mode).
    pub vectors: DMatrix<f64>,
    /// Leakage factor of each mode, m.
    pub lambdas: Vec<Option<f64>>,
}

impl WallModes {
    /// One aquifer: one mode, Laplace or of leakage factor `b` (a leaky top, Hantush–Jacob).
    pub fn single(b: Option<f64>) -> WallModes {
        WallModes {
            sqrt_t: vec![1.0],
            vectors: DMatrix::from_element(1, 1, 1.0),
            lambdas: vec![b],
        }
    }
}

/// One element of a wall: its segment and its images, and the aquifers it cuts with the
/// conductance 1/(K_j·c) of each (0 when impermeable).
#[derive(Debug, Clone)]
struct Element {
    /// The segment and its images with their factors (+1 for the element itself).
    pieces: Vec<(Segment, f64)>,
    /// The element itself.
    seg: Segment,
    /// Aquifers cut and 1/(K_j·c) in each, 1/m.
    cut: Vec<(usize, f64)>,
    /// Index of its wall.
    wall: usize,
}

/// Consecutive elements of one wall, with the geometry of each of their strings (the wall and
/// each image) for the far field of the Laplace mode ([`crate::field::wall_far`]).
#[derive(Debug, Clone)]
struct Block {
    /// First element and one past the last.
    range: (usize, usize),
    /// One per piece of the elements (the wall, then each image).
    strings: Vec<BlockGeometry>,
}

/// The jumps of every element in every mode for one set of well rates, and the far-field
/// moments of every block's strings in the Laplace mode.
#[derive(Debug)]
pub struct Jumps {
    per_element: Vec<Vec<f64>>,
    moments: Vec<Vec<Moments>>,
}

/// The walls of one field, solved for each well of unit rate.
#[derive(Debug)]
pub struct WallSolution {
    modes: WallModes,
    elements: Vec<Element>,
    /// coef[e][k][w]: the jump of mode k on element e per unit rate of well w, divided by
    /// nothing yet: ΔΦ_i += √T_i·U_ik·D_k,e(x)·coef[e][k][w].
    coef: Vec<Vec<Vec<f64>>>,
    unknowns: usize,
    aquifers: usize,
    blocks: Vec<Block>,
    /// The Laplace (zero) mode, when the ground has one.
    laplace: Option<usize>,
    /// The jumps of the last rates asked (levels at many points one by one reuse them).
    last_jumps: std::sync::Mutex<Option<(Vec<f64>, std::sync::Arc<Jumps>)>>,
}

impl Clone for WallSolution {
    fn clone(&self) -> Self {
        WallSolution {
            modes: self.modes.clone(),
            elements: self.elements.clone(),
            coef: self.coef.clone(),
            unknowns: self.unknowns,
            aquifers: self.aquifers,
            blocks: self.blocks.clone(),
            laplace: self.laplace,
            last_jumps: std::sync::Mutex::new(None),
        }
    }
}

/// The inputs of a solve: the walls in the field's local coordinates.
pub struct WallInput<'a> {
    /// The walls (site coordinates).
    pub walls: &'a [Wall],
    /// For each wall, the aquifers it cuts.
    pub cut: Vec<Vec<usize>>,
    /// Horizontal conductivity of each aquifer, m/s.
    pub conductivities: Vec<f64>,
    /// The modes.
    pub modes: WallModes,
    /// Straight boundaries in local coordinates.
    pub lines: Vec<([f64; 2], [f64; 2], BoundaryKind)>,
    /// The field's origin (site coordinates of local 0, 0).
    pub origin: [f64; 2],
}

impl WallSolution {
    /// Solve the walls of `input` for `wells` wells; `wells_row(x, j)` is the change of
    /// potential in aquifer j at local point x per unit rate of each well, without walls.
    pub fn new(
        input: WallInput,
        wells: usize,
        wells_row: impl Fn([f64; 2], usize) -> Vec<f64>,
    ) -> WallSolution {
        let elements = elements(&input);
        let modes = input.modes;
        let index: Vec<(usize, usize, f64)> = elements
            .iter()
            .enumerate()
            .flat_map(|(e, el)| el.cut.iter().map(move |&(j, g)| (e, j, g)))
            .collect();
        let n = index.len();
        let nk = modes.lambdas.len();
        let mut b = DMatrix::<f64>::zeros(n, wells);
        let mut row = 0;
        for el in &elements {
            let x = el.seg.midpoint();
            let nrm = el.seg.normal();
            for (r, &(j, _)) in el.cut.iter().enumerate() {
                let plus = wells_row([x[0] + DIFF_STEP * nrm[0], x[1] + DIFF_STEP * nrm[1]], j);
                let minus = wells_row([x[0] - DIFF_STEP * nrm[0], x[1] - DIFF_STEP * nrm[1]], j);
                for w in 0..wells {
                    b[(row + r, w)] = -(plus[w] - minus[w]) / (2.0 * DIFF_STEP);
                }
            }
            row += el.cut.len();
        }
        // the matrix depends on the walls and the ground only, not on the wells: factorised
        // once and kept for every layout tried on the same model
        let key = system_key(&elements, &modes);
        let cached = LAST_SYSTEM.lock().ok().and_then(|g| {
            g.as_ref()
                .filter(|(k, _)| *k == key)
                .map(|(_, f)| f.clone())
        });
        let factors = cached.unwrap_or_else(|| {
            let f = std::sync::Arc::new(system_matrix(&elements, &modes, n).lu());
            if let Ok(mut g) = LAST_SYSTEM.lock() {
                *g = Some((key, f.clone()));
            }
            f
        });
        let mu = factors.solve(&b).unwrap_or_else(|| {
            system_matrix(&elements, &modes, n)
                .svd(true, true)
                .solve(&b, 1e-12)
                .unwrap_or(b * 0.0)
        });
        crate::work_counts::add(&crate::work_counts::WALL_SOLVES, 1);
        let coef = (0..elements.len())
            .map(|e| {
                (0..nk)
                    .map(|k| {
                        (0..wells)
                            .map(|w| {
                                index
                                    .iter()
                                    .enumerate()
                                    .filter(|(_, (ie, _, _))| *ie == e)
                                    .map(|(u, &(_, j, _))| {
                                        modes.vectors[(j, k)] / modes.sqrt_t[j] * mu[(u, w)]
                                    })
                                    .sum()
                            })
                            .collect()
                    })
                    .collect()
            })
            .collect();
        let blocks = blocks(&elements);
        WallSolution {
            aquifers: modes.sqrt_t.len(),
            laplace: modes.lambdas.iter().position(Option::is_none),
            blocks,
            modes,
            elements,
            coef,
            unknowns: n,
            last_jumps: std::sync::Mutex::new(None),
        }
    }

    /// Size of the solved system: (collocation points, aquifers, unknowns).
    pub fn size(&self) -> (usize, usize, usize) {
        (self.elements.len(), self.aquifers, self.unknowns)
    }

    /// Add `f(well, ΔΦ per unit rate)` in aquifer `at` at local point x: the walls' share.
    pub fn for_each(&self, x: [f64; 2], at: usize, mut f: impl FnMut(usize, f64)) {
        let Some(wells) = self.coef.first().and_then(|c| c.first()).map(Vec::len) else {
            return;
        };
        let mut sum = vec![0.0; wells];
        for (el, coef) in self.elements.iter().zip(&self.coef) {
            for (k, lambda) in self.modes.lambdas.iter().enumerate() {
                let weight = self.modes.sqrt_t[at] * self.modes.vectors[(at, k)];
                let d = weight * self.element_value(el, *lambda, x);
                if d == 0.0 {
                    continue;
                }
                for (sw, c) in sum.iter_mut().zip(&coef[k]) {
                    *sw += d * c;
                }
            }
        }
        for (w, v) in sum.into_iter().enumerate() {
            f(w, v);
        }
    }

    /// The jump of each mode on each element for the well rates `rates` (m³/s), and the
    /// blocks' far-field moments, for [`WallSolution::delta`]: one sum over the wells, then
    /// none per point.
    pub fn jumps(&self, rates: &[f64]) -> Jumps {
        let per_element: Vec<Vec<f64>> = self
            .coef
            .iter()
            .map(|modes| {
                modes
                    .iter()
                    .map(|c| c.iter().zip(rates).map(|(c, q)| c * q).sum())
                    .collect()
            })
            .collect();
        let moments = match self.laplace {
            Some(k) => self
                .blocks
                .iter()
                .map(|b| {
                    let mu: Vec<f64> = (b.range.0..b.range.1).map(|e| per_element[e][k]).collect();
                    b.strings.iter().map(|g| g.moments(&mu)).collect()
                })
                .collect(),
            None => Vec::new(),
        };
        Jumps {
            per_element,
            moments,
        }
    }

    /// [`WallSolution::jumps`] of `rates`, kept for the next call with the same rates.
    pub fn jumps_cached(&self, rates: &[f64]) -> std::sync::Arc<Jumps> {
        if let Ok(guard) = self.last_jumps.lock() {
            if let Some((r, j)) = guard.as_ref() {
                if r.as_slice() == rates {
                    return j.clone();
                }
            }
        }
        let j = std::sync::Arc::new(self.jumps(rates));
        if let Ok(mut guard) = self.last_jumps.lock() {
            *guard = Some((rates.to_vec(), j.clone()));
        }
        j
    }

    /// The walls' ΔΦ in aquifer `at` at local point x for the jumps of
    /// [`WallSolution::jumps`]; blocks far from x in the Laplace mode by their moments.
    pub fn delta(&self, x: [f64; 2], at: usize, jumps: &Jumps) -> f64 {
        let mut sum = 0.0;
        for (bi, b) in self.blocks.iter().enumerate() {
            let (s, t) = b.range;
            for (k, lambda) in self.modes.lambdas.iter().enumerate() {
                let weight = self.modes.sqrt_t[at] * self.modes.vectors[(at, k)];
                if weight == 0.0 {
                    continue;
                }
                if Some(k) == self.laplace {
                    for (p, g) in b.strings.iter().enumerate() {
                        match g.far_powers(x) {
                            Some(pw) => sum += weight * far_value(&jumps.moments[bi][p], &pw),
                            None => {
                                for e in s..t {
                                    let (seg, fac) = &self.elements[e].pieces[p];
                                    sum += weight
                                        * jumps.per_element[e][k]
                                        * fac
                                        * doublet_value(seg, None, x);
                                }
                            }
                        }
                    }
                } else {
                    for e in s..t {
                        let j = jumps.per_element[e][k];
                        if j != 0.0 {
                            sum += weight * j * self.element_value(&self.elements[e], *lambda, x);
                        }
                    }
                }
            }
        }
        sum
    }

    /// The doublet of unit jump of element `el` in one mode at x, images included.
    fn element_value(&self, el: &Element, lambda: Option<f64>, x: [f64; 2]) -> f64 {
        el.pieces
            .iter()
            .map(|(s, fac)| fac * doublet_value(s, lambda, x))
            .sum()
    }
}

/// The LU factors of the last wall system, with the bits of its elements and modes.
type Factors = std::sync::Arc<nalgebra::LU<f64, nalgebra::Dyn, nalgebra::Dyn>>;
static LAST_SYSTEM: std::sync::Mutex<Option<(Vec<u64>, Factors)>> = std::sync::Mutex::new(None);

/// The bits of every number the system matrix is made of.
fn system_key(elements: &[Element], modes: &WallModes) -> Vec<u64> {
    let mut k = Vec::new();
    for el in elements {
        for (s, f) in &el.pieces {
            k.extend([s.a[0], s.a[1], s.b[0], s.b[1], *f].map(f64::to_bits));
        }
        for (j, g) in &el.cut {
            k.extend([*j as u64, g.to_bits()]);
        }
    }
    k.extend(modes.sqrt_t.iter().map(|v| v.to_bits()));
    k.extend(modes.vectors.iter().map(|v| v.to_bits()));
    k.extend(
        modes
            .lambdas
            .iter()
            .map(|l| l.map_or(u64::MAX, f64::to_bits)),
    );
    k
}

/// The system matrix: the normal derivative at each collocation point, in each aquifer its
/// element cuts, of every unknown jump, less 1/(K_j·c) on the diagonal of a leaky wall.
fn system_matrix(elements: &[Element], modes: &WallModes, n: usize) -> DMatrix<f64> {
    let nk = modes.lambdas.len();
    let mut a = DMatrix::<f64>::zeros(n, n);
    let mut grads = vec![[0.0; 2]; nk];
    let mut col_start = Vec::with_capacity(elements.len());
    let mut c = 0;
    for el in elements {
        col_start.push(c);
        c += el.cut.len();
    }
    let mut row = 0;
    for el in elements {
        let x = el.seg.midpoint();
        let nrm = el.seg.normal();
        for (e2, other) in elements.iter().enumerate() {
            for (k, g) in grads.iter_mut().enumerate() {
                *g = other.pieces.iter().fold([0.0, 0.0], |acc, (s, f)| {
                    let (_, d) = doublet(s, modes.lambdas[k], x);
                    [acc[0] + f * d[0], acc[1] + f * d[1]]
                });
            }
            for (r, &(j, _)) in el.cut.iter().enumerate() {
                for (c2, &(j2, _)) in other.cut.iter().enumerate() {
                    let ratio = modes.sqrt_t[j] / modes.sqrt_t[j2];
                    let v: f64 = (0..nk)
                        .map(|k| {
                            modes.vectors[(j, k)]
                                * modes.vectors[(j2, k)]
                                * (nrm[0] * grads[k][0] + nrm[1] * grads[k][1])
                        })
                        .sum();
                    a[(row + r, col_start[e2] + c2)] = ratio * v;
                }
            }
        }
        for (r, &(_, g)) in el.cut.iter().enumerate() {
            a[(row + r, row + r)] -= g;
        }
        row += el.cut.len();
    }
    a
}

/// The elements of every wall, in local coordinates, with their images.
fn elements(input: &WallInput) -> Vec<Element> {
    let total: f64 = input.walls.iter().map(Wall::length).sum();
    let target = (total / ELEMENTS_PER_WALL_LENGTH).max(MIN_ELEMENT);
    let o = input.origin;
    let mut out = Vec::new();
    for (wi, (w, cut)) in input.walls.iter().zip(&input.cut).enumerate() {
        let cut: Vec<(usize, f64)> = cut
            .iter()
            .map(|&j| {
                let g = w
                    .resistance
                    .map_or(0.0, |c| 1.0 / (input.conductivities[j] * c));
                (j, g)
            })
            .collect();
        for (a, b) in w.pieces() {
            let len = (b[0] - a[0]).hypot(b[1] - a[1]);
            let m = (len / target).ceil().max(1.0) as usize;
            for i in 0..m {
                let t0 = i as f64 / m as f64;
                let t1 = (i + 1) as f64 / m as f64;
                let p = |t: f64| {
                    [
                        a[0] + t * (b[0] - a[0]) - o[0],
                        a[1] + t * (b[1] - a[1]) - o[1],
                    ]
                };
                let seg = Segment { a: p(t0), b: p(t1) };
                let mut pieces = vec![(seg, 1.0)];
                for (la, lb, kind) in &input.lines {
                    // the mirrored element's normal is the mirror of the normal, which is the
                    // right of a' → b': so −(its left-normal doublet), times the image's sign
                    let image = Segment {
                        a: mirror_point(seg.a, *la, *lb),
                        b: mirror_point(seg.b, *la, *lb),
                    };
                    pieces.push((image, -image_sign(*kind)));
                }
                out.push(Element {
                    pieces,
                    seg,
                    cut: cut.clone(),
                    wall: wi,
                });
            }
        }
    }
    out
}

/// The elements in blocks of at most [`BLOCK`] consecutive ones of the same wall.
fn blocks(elements: &[Element]) -> Vec<Block> {
    let mut out = Vec::new();
    let mut s = 0;
    while s < elements.len() {
        let mut t = s + 1;
        while t < elements.len() && t - s < BLOCK && elements[t].wall == elements[s].wall {
            t += 1;
        }
        let strings = (0..elements[s].pieces.len())
            .map(|p| {
                let mut v: Vec<[f64; 2]> = (s..t).map(|e| elements[e].pieces[p].0.a).collect();
                v.push(elements[t - 1].pieces[p].0.b);
                BlockGeometry::new(&v, elements[s].pieces[p].1)
            })
            .collect();
        out.push(Block {
            range: (s, t),
            strings,
        });
        s = t;
    }
    out
}
