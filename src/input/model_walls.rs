//! Cut-off walls in the validated model: a polyline (or closed polygon) of vertices in site
//! coordinates, the aquifers it cuts (down to its toe) and its resistance when leaky.

/// One cut-off wall.
#[derive(Debug, Clone)]
pub struct Wall {
    /// Name from `[[wall]]`.
    pub name: String,
    /// Vertices, m (site coordinates); for a closed wall the last joins the first.
    pub vertices: Vec<[f64; 2]>,
    /// Whether the wall closes on itself.
    pub closed: bool,
    /// Level of the toe, m; `None`: the wall cuts every aquifer down to the impermeable base.
    pub toe_level: Option<f64>,
    /// Resistance c = thickness/K of a leaky wall, s; `None`: impermeable.
    pub resistance: Option<f64>,
}

impl Wall {
    /// The straight pieces of the wall, in order (closing piece included).
    pub fn pieces(&self) -> Vec<([f64; 2], [f64; 2])> {
        let mut v: Vec<_> = self.vertices.windows(2).map(|w| (w[0], w[1])).collect();
        if self.closed && self.vertices.len() > 2 {
            v.push((self.vertices[self.vertices.len() - 1], self.vertices[0]));
        }
        v
    }

    /// Length along the wall, m.
    pub fn length(&self) -> f64 {
        self.pieces()
            .iter()
            .map(|(a, b)| (b[0] - a[0]).hypot(b[1] - a[1]))
            .sum()
    }
}
