//! Plane geometry for the layout: a point type and the few operations the
//! placement and clean-up passes need.

use std::ops::{Add, Mul, Sub};

/// A point (or vector) in layout units: one bond is 1.0 long, x grows to the
/// right and y grows downward, as in SVG.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Point {
    /// Horizontal coordinate.
    pub x: f64,
    /// Vertical coordinate (downward).
    pub y: f64,
}

impl Point {
    /// A point from its coordinates.
    pub const fn new(x: f64, y: f64) -> Point {
        Point { x, y }
    }

    /// Unit vector at `angle` radians from the x axis.
    pub fn polar(angle: f64) -> Point {
        Point::new(angle.cos(), angle.sin())
    }

    /// Length of the vector.
    pub fn len(self) -> f64 {
        self.x.hypot(self.y)
    }

    /// Distance to `o`.
    pub fn dist(self, o: Point) -> f64 {
        (self - o).len()
    }

    /// Angle of the vector from the x axis, radians.
    pub fn angle(self) -> f64 {
        self.y.atan2(self.x)
    }

    /// Dot product.
    pub fn dot(self, o: Point) -> f64 {
        self.x * o.x + self.y * o.y
    }

    /// z component of the cross product.
    pub fn cross(self, o: Point) -> f64 {
        self.x * o.y - self.y * o.x
    }

    /// The vector rotated by `angle` radians.
    pub fn rotate(self, angle: f64) -> Point {
        let (s, c) = angle.sin_cos();
        Point::new(self.x * c - self.y * s, self.x * s + self.y * c)
    }

    /// The vector turned by a quarter turn.
    pub fn perp(self) -> Point {
        Point::new(-self.y, self.x)
    }

    /// The vector scaled to length 1 (unchanged when it is zero).
    pub fn unit(self) -> Point {
        let l = self.len();
        if l > 1e-12 {
            self * (1.0 / l)
        } else {
            self
        }
    }

    /// Both coordinates are finite.
    pub fn is_finite(self) -> bool {
        self.x.is_finite() && self.y.is_finite()
    }
}

impl Add for Point {
    type Output = Point;
    fn add(self, o: Point) -> Point {
        Point::new(self.x + o.x, self.y + o.y)
    }
}

impl Sub for Point {
    type Output = Point;
    fn sub(self, o: Point) -> Point {
        Point::new(self.x - o.x, self.y - o.y)
    }
}

impl Mul<f64> for Point {
    type Output = Point;
    fn mul(self, k: f64) -> Point {
        Point::new(self.x * k, self.y * k)
    }
}

/// Mean of the points (the origin for none).
pub(crate) fn centroid(points: impl Iterator<Item = Point>) -> Point {
    let (mut s, mut n) = (Point::default(), 0usize);
    for p in points {
        s = s + p;
        n += 1;
    }
    if n == 0 {
        s
    } else {
        s * (1.0 / n as f64)
    }
}

/// `p` reflected across the line through `a` and `b`.
pub(crate) fn reflect(p: Point, a: Point, b: Point) -> Point {
    let d = (b - a).unit();
    let v = p - a;
    let along = d * v.dot(d);
    a + along * 2.0 - v
}

/// Orientation of `r` relative to the directed line `p` → `q` (twice the
/// signed triangle area).
pub(crate) fn orient(p: Point, q: Point, r: Point) -> f64 {
    (q - p).cross(r - p)
}

/// The segments `p1 p2` and `q1 q2` cross properly (each strictly separates
/// the other's ends; touching and collinear overlap do not count).
pub fn segments_cross(p1: Point, p2: Point, q1: Point, q2: Point) -> bool {
    const EPS: f64 = 1e-9;
    let o1 = orient(p1, p2, q1);
    let o2 = orient(p1, p2, q2);
    let o3 = orient(q1, q2, p1);
    let o4 = orient(q1, q2, p2);
    ((o1 > EPS && o2 < -EPS) || (o1 < -EPS && o2 > EPS))
        && ((o3 > EPS && o4 < -EPS) || (o3 < -EPS && o4 > EPS))
}

/// Angle normalised to [0, 2π).
pub(crate) fn norm_angle(a: f64) -> f64 {
    let t = a.rem_euclid(std::f64::consts::TAU);
    if t.is_finite() {
        t
    } else {
        0.0
    }
}
