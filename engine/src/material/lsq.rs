//! Small dense linear least squares by Householder QR (Golub & Van Loan,
//! Matrix Computations, 4th ed., §5.2 and §5.3). QR on the matrix itself
//! instead of the normal equations keeps the error proportional to the
//! condition number, not its square.

/// Outcome of a least-squares solve.
pub(crate) enum Lsq {
    Solved(Vec<f64>),
    /// A column is (numerically) a combination of the others.
    Singular,
}

/// Minimises ‖A·x − b‖₂ for an `n × p` matrix `a` stored by rows, `n ≥ p`.
/// A column whose remaining norm after the reflections falls below
/// `1e-10` of its original norm makes the system singular.
pub(crate) fn solve(mut a: Vec<f64>, mut b: Vec<f64>, n: usize, p: usize) -> Lsq {
    debug_assert!(a.len() == n * p && b.len() == n && n >= p);
    let col_norm: Vec<f64> = (0..p).map(|j| (0..n).map(|i| a[i * p + j].powi(2)).sum::<f64>().sqrt()).collect();
    let mut diag = vec![0.0; p];
    for j in 0..p {
        // Householder vector v for column j below the diagonal.
        let norm: f64 = (j..n).map(|i| a[i * p + j].powi(2)).sum::<f64>().sqrt();
        if norm.is_nan() || norm <= 1e-10 * col_norm[j] || col_norm[j] == 0.0 {
            return Lsq::Singular;
        }
        let x0 = a[j * p + j];
        let alpha = if x0 > 0.0 { -norm } else { norm };
        // v = x − alpha·e1, stored in place of the column.
        a[j * p + j] = x0 - alpha;
        let vtv: f64 = (j..n).map(|i| a[i * p + j].powi(2)).sum();
        if vtv == 0.0 {
            diag[j] = alpha;
            continue;
        }
        for c in j + 1..p {
            let dot: f64 = (j..n).map(|i| a[i * p + j] * a[i * p + c]).sum();
            let s = 2.0 * dot / vtv;
            for i in j..n {
                a[i * p + c] -= s * a[i * p + j];
            }
        }
        let dot: f64 = (j..n).map(|i| a[i * p + j] * b[i]).sum();
        let s = 2.0 * dot / vtv;
        for i in j..n {
            b[i] -= s * a[i * p + j];
        }
        diag[j] = alpha;
    }
    // Back substitution R·x = Qᵀb (R's diagonal in `diag`, above it in `a`).
    let mut x = vec![0.0; p];
    for j in (0..p).rev() {
        let mut s = b[j];
        for c in j + 1..p {
            s -= a[j * p + c] * x[c];
        }
        x[j] = s / diag[j];
    }
    if x.iter().all(|v| v.is_finite()) {
        Lsq::Solved(x)
    } else {
        Lsq::Singular
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fits_a_line_exactly_and_detects_collinear_columns() {
        // y = 2 + 3x through four points: a straight-line fit (algebra).
        let xs = [0.0, 1.0, 2.0, 5.0];
        let a: Vec<f64> = xs.iter().flat_map(|&x| [1.0, x]).collect();
        let b: Vec<f64> = xs.iter().map(|&x| 2.0 + 3.0 * x).collect();
        match solve(a, b, 4, 2) {
            Lsq::Solved(x) => {
                assert!((x[0] - 2.0).abs() < 1e-12 && (x[1] - 3.0).abs() < 1e-12);
            }
            Lsq::Singular => panic!("not singular"),
        }
        // Second column = 2 × first: singular.
        let a = vec![1.0, 2.0, 1.0, 2.0, 1.0, 2.0];
        assert!(matches!(solve(a, vec![1.0, 2.0, 3.0], 3, 2), Lsq::Singular));
    }

    #[test]
    fn least_squares_matches_the_normal_equations() {
        // Mean of 1, 2, 6 is the least-squares constant (3): definition.
        match solve(vec![1.0, 1.0, 1.0], vec![1.0, 2.0, 6.0], 3, 1) {
            Lsq::Solved(x) => assert!((x[0] - 3.0).abs() < 1e-12),
            Lsq::Singular => panic!(),
        }
    }
}
