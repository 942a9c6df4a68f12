//! A small seeded random number generator for the Monte Carlo study: SplitMix64 to
//! derive one independent stream per sample from the seed, xoshiro256** within the
//! stream (Blackman and Vigna, "Scrambled linear pseudorandom number generators",
//! 2021; constants from the authors' reference code, from memory). Hand-written to keep
//! the build lean; not for cryptography.

/// SplitMix64 step (Steele, Lea and Flood 2014): returns the next output.
pub fn splitmix64(state: &mut u64) -> u64 {
    *state = state.wrapping_add(0x9E37_79B9_7F4A_7C15);
    let mut z = *state;
    z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
    z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
    z ^ (z >> 31)
}

/// xoshiro256** generator.
#[derive(Debug, Clone)]
pub struct Rng {
    s: [u64; 4],
}

impl Rng {
    /// The generator of stream `stream` under `seed`: sample `i` of a study always uses
    /// stream `i`, so results do not depend on how samples are split over threads.
    pub fn stream(seed: u64, stream: u64) -> Rng {
        let mut mixed = stream.wrapping_mul(0xD134_2543_DE82_EF95);
        let mut sm = seed ^ splitmix64(&mut mixed);
        let mut s = [0u64; 4];
        for x in &mut s {
            *x = splitmix64(&mut sm);
        }
        if s == [0; 4] {
            s[0] = 1;
        }
        Rng { s }
    }

    /// Next 64 random bits.
    pub fn next_u64(&mut self) -> u64 {
        let result = self.s[1].wrapping_mul(5).rotate_left(7).wrapping_mul(9);
        let t = self.s[1] << 17;
        self.s[2] ^= self.s[0];
        self.s[3] ^= self.s[1];
        self.s[1] ^= self.s[2];
        self.s[0] ^= self.s[3];
        self.s[2] ^= t;
        self.s[3] = self.s[3].rotate_left(45);
        result
    }

    /// Uniform in [0, 1), 53 random bits.
    pub fn uniform(&mut self) -> f64 {
        (self.next_u64() >> 11) as f64 * (1.0 / (1u64 << 53) as f64)
    }

    /// Standard normal by the Box–Muller transform.
    pub fn normal(&mut self) -> f64 {
        // 1 − u lies in (0, 1], so its logarithm is finite.
        let u1 = 1.0 - self.uniform();
        let u2 = self.uniform();
        (-2.0 * u1.ln()).sqrt() * (std::f64::consts::TAU * u2).cos()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn streams_are_repeatable_and_distinct() {
        let a: Vec<u64> = (0..4).map(|_| Rng::stream(7, 3).next_u64()).collect();
        assert!(a.windows(2).all(|w| w[0] == w[1]));
        assert_ne!(Rng::stream(7, 3).next_u64(), Rng::stream(7, 4).next_u64());
        assert_ne!(Rng::stream(7, 3).next_u64(), Rng::stream(8, 3).next_u64());
    }

    #[test]
    fn uniform_and_normal_moments() {
        // Sampling check: mean of 1/2 and 0, variance of 1/12 and 1, within 4 standard
        // errors for 100 000 draws (hand calculation: SE of the uniform mean ≈ 0.0009).
        let mut r = Rng::stream(1, 0);
        let n = 100_000;
        let u: Vec<f64> = (0..n).map(|_| r.uniform()).collect();
        let mean = u.iter().sum::<f64>() / n as f64;
        let var = u.iter().map(|x| (x - mean).powi(2)).sum::<f64>() / n as f64;
        assert!((mean - 0.5).abs() < 0.004, "{mean}");
        assert!((var - 1.0 / 12.0).abs() < 0.002, "{var}");
        let z: Vec<f64> = (0..n).map(|_| r.normal()).collect();
        let mean = z.iter().sum::<f64>() / n as f64;
        let var = z.iter().map(|x| (x - mean).powi(2)).sum::<f64>() / n as f64;
        assert!(mean.abs() < 0.013, "{mean}");
        assert!((var - 1.0).abs() < 0.02, "{var}");
    }
}
