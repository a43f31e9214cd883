//! What the laboratories that make up their own series share (alert_lab, stock_lab): a
//! seeded source of draws, the same every run, and their `--count` option.

/// A 64-bit linear congruential generator (Knuth's MMIX constants), seeded.
pub struct Draws(pub u64);

#[allow(dead_code)]
impl Draws {
    /// Uniform on (0, 1).
    pub fn uniform(&mut self) -> f64 {
        self.0 = self
            .0
            .wrapping_mul(6_364_136_223_846_793_005)
            .wrapping_add(1_442_695_040_888_963_407);
        ((self.0 >> 11) as f64 + 0.5) / (1u64 << 53) as f64
    }

    /// Standard normal, by Box-Muller.
    pub fn normal(&mut self) -> f64 {
        (-2.0 * self.uniform().ln()).sqrt() * (2.0 * std::f64::consts::PI * self.uniform()).cos()
    }

    /// Poisson by inversion (small means only).
    pub fn poisson(&mut self, mean: f64) -> f64 {
        let (mut k, mut p, mut total) = (0.0, (-mean).exp(), (-mean).exp());
        let u = self.uniform();
        while u > total && k < 1000.0 {
            k += 1.0;
            p *= mean / k;
            total += p;
        }
        k
    }
}

/// The number after `--count` on the command line, else `default`: series per case.
pub fn count_option(default: usize) -> usize {
    let args: Vec<String> = std::env::args().collect();
    args.iter()
        .position(|a| a == "--count")
        .and_then(|i| args.get(i + 1))
        .and_then(|v| v.parse().ok())
        .unwrap_or(default)
}
