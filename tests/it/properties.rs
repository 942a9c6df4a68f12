//! Invariants of the solver over random rigs (proptest): zero friction is the
//! virtual-work answer, the energy audit balances, friction never helps the drive,
//! passage ratios invert between forward and back, rigid motion of the whole rig and
//! the order of the file's parts and lines change nothing.
//!
//! The random rigs are planar tackles (sheaves side by side in the plane of the rope,
//! positions jittered so the falls are not parallel) with random bearings, sheave
//! weights, a guide, and optionally a runner tackle on the hauling part (a compound
//! rig with two lines). Source of the invariants: principle of virtual work and the
//! work–energy balance (any statics text, e.g. Beer & Johnston, *Statics*, ch. 10);
//! DESIGN.md §§1–3. The energy audit is also checked on every small rig in
//! `tests/rigs/review/`.

use std::collections::BTreeMap;

use approx::relative_eq;
use proptest::prelude::*;
use reeve::math::STANDARD_GRAVITY;
use reeve::model::LineId;
use reeve::rig::load_str;
use reeve::solve::{solve, Case, Solution, SolveOptions, Status};

use crate::support::{assert_rel, audit_ok, solve_test_rig, solve_text, test_rig};

type V3 = [f64; 3];

/// A bearing (or guide) choice for one round part.
#[derive(Clone, Debug)]
enum Round {
    Rated(f64),
    Plain { pin: f64, mu: f64, mass: f64 },
    Rolling { bore: f64, mu: f64, mass: f64 },
    Free,
    Guide { mu: f64 },
}

/// One part as written, with its vectors kept apart so they can be moved rigidly.
#[derive(Clone, Debug)]
struct PartSpec {
    name: String,
    at: V3,
    axle: Option<V3>,
    moves: Option<V3>,
    pull: Option<V3>,
    rest: String,
}

#[derive(Clone, Debug)]
pub(super) struct RigSpec {
    gravity: V3,
    parts: Vec<PartSpec>,
    /// (name, path)
    lines: Vec<(String, String)>,
    /// Which part is asked for.
    solve_for: String,
}

/// A rigid motion: rotation (row-major) and translation.
#[derive(Clone, Debug)]
struct Rigid {
    rot: [[f64; 3]; 3],
    shift: V3,
}

impl Rigid {
    fn identity() -> Rigid {
        Rigid {
            rot: [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]],
            shift: [0.0; 3],
        }
    }
    /// Rotation by `angle` about the unit axis through the spherical angles given.
    fn new(theta: f64, phi: f64, angle: f64, shift: V3) -> Rigid {
        let k = [
            theta.sin() * phi.cos(),
            theta.sin() * phi.sin(),
            theta.cos(),
        ];
        let (s, c) = angle.sin_cos();
        let mut rot = [[0.0; 3]; 3];
        // Rodrigues: R = c I + s [k]× + (1 − c) k kᵀ.
        let cross = [[0.0, -k[2], k[1]], [k[2], 0.0, -k[0]], [-k[1], k[0], 0.0]];
        for i in 0..3 {
            for j in 0..3 {
                rot[i][j] = (1.0 - c) * k[i] * k[j] + s * cross[i][j];
                if i == j {
                    rot[i][j] += c;
                }
            }
        }
        Rigid { rot, shift }
    }
    fn dir(&self, v: V3) -> V3 {
        let r = &self.rot;
        [
            r[0][0] * v[0] + r[0][1] * v[1] + r[0][2] * v[2],
            r[1][0] * v[0] + r[1][1] * v[1] + r[1][2] * v[2],
            r[2][0] * v[0] + r[2][1] * v[1] + r[2][2] * v[2],
        ]
    }
    fn point(&self, v: V3) -> V3 {
        let d = self.dir(v);
        [
            d[0] + self.shift[0],
            d[1] + self.shift[1],
            d[2] + self.shift[2],
        ]
    }
}

fn vec_text(v: V3) -> String {
    format!("[{:?}, {:?}, {:?}]", v[0], v[1], v[2])
}

impl RigSpec {
    /// The rig file, moved by `motion`, with parts and lines in the given orders.
    fn render(&self, motion: &Rigid, part_order: &[usize], line_order: &[usize]) -> String {
        let mut text = format!(
            "format: 1\ntitle: random rig\nunits: {{length: m, force: N, mass: kg}}\n\
             gravity: {}\nropes:\n  wire: {{diameter: 0.01, mu: 0.15}}\nparts:\n",
            vec_text(motion.dir(self.gravity))
        );
        for &i in part_order {
            let p = &self.parts[i];
            let mut keys = format!("at: {}", vec_text(motion.point(p.at)));
            if let Some(a) = p.axle {
                keys += &format!(", axle: {}", vec_text(motion.dir(a)));
            }
            if let Some(m) = p.moves {
                keys += &format!(", moves: {}", vec_text(motion.dir(m)));
            }
            if let Some(m) = p.pull {
                keys += &format!(", pull: {}", vec_text(motion.dir(m)));
            }
            text += &format!("  {}: {{{}, {}}}\n", p.name, p.rest, keys);
        }
        text += "lines:\n";
        for &i in line_order {
            let (name, path) = &self.lines[i];
            text += &format!("  {name}: {{rope: wire, path: [{path}]}}\n");
        }
        text += &format!("drive: haul\nsolve_for: {}\n", self.solve_for);
        text
    }

    pub(super) fn plain(&self) -> String {
        let parts: Vec<usize> = (0..self.parts.len()).collect();
        let lines: Vec<usize> = (0..self.lines.len()).collect();
        self.render(&Rigid::identity(), &parts, &lines)
    }
}

/// Parameters of a random rig.
#[derive(Clone, Debug)]
pub(super) struct Params {
    n: usize,
    rounds: Vec<Round>,
    jitter: Vec<f64>,
    heights: Vec<f64>,
    load_mass: f64,
    compound: bool,
    runner_mass: f64,
    pull_given: bool,
    /// Wind the hauling part on a drum instead of a haul end: (shaft text, drum mass).
    drum: Option<(String, f64)>,
    pub(super) load_unknown: bool,
}

/// The hook's total weight and the runner's, for the virtual-work answer.
pub(super) struct Masses {
    hook: f64,
    runner: f64,
}

fn round_text(r: &Round) -> (String, f64) {
    let diameter = "diameter: 0.19";
    match *r {
        Round::Rated(k) => (
            format!("kind: sheave, {diameter}, bearing: {{kind: rated, factor: {k:?}}}"),
            0.0,
        ),
        Round::Plain { pin, mu, mass } => (
            format!(
                "kind: sheave, {diameter}, mass: {mass:?}, bearing: {{kind: plain, pin_diameter: {pin:?}, mu: {mu:?}}}"
            ),
            mass,
        ),
        Round::Rolling { bore, mu, mass } => (
            format!(
                "kind: sheave, {diameter}, mass: {mass:?}, bearing: {{kind: rolling, bore: {bore:?}, mu: {mu:?}}}"
            ),
            mass,
        ),
        Round::Free => (
            format!("kind: sheave, {diameter}, bearing: {{kind: none}}"),
            0.0,
        ),
        Round::Guide { mu } => (format!("kind: guide, {diameter}, mu: {mu:?}"), 0.0),
    }
}

/// Builds the rig: an `n`-part tackle whose falls stand roughly at x = j·a (jittered),
/// hauling part leaving the fixed block over a last round part, down to the haul or to
/// a runner block pulled down by a second line.
pub(super) fn build(p: &Params) -> (RigSpec, Masses) {
    let n = p.n;
    let a = 0.2; // = pitch diameter: unjittered falls stand exactly vertical
    let (top, bottom) = (5.0, 1.0);
    let up = |j: usize| (n - 1 - j) % 2 == 0;
    let mut parts = Vec::new();
    let mut hook_mass = p.load_mass;
    parts.push(PartSpec {
        name: "hook".into(),
        at: [0.0, 0.0, bottom],
        axle: None,
        moves: Some([0.0, 0.0, 1.0]),
        pull: None,
        rest: if p.load_unknown {
            "kind: block, load: {mass: 1.0}".into()
        } else {
            format!("kind: block, load: {{mass: {:?}}}", p.load_mass)
        },
    });
    let mut path = Vec::new();
    if up(0) {
        path.push("hook".to_string());
    } else {
        parts.push(PartSpec {
            name: "dead".into(),
            at: [0.0, 0.0, top],
            axle: None,
            moves: None,
            pull: None,
            rest: "kind: anchor".into(),
        });
        path.push("dead".to_string());
    }
    // n − 1 turns between falls plus the last fixed round part.
    for j in 0..n {
        let name = format!("s{j}");
        let x = (j as f64 + 0.5) * a + p.jitter[j] * a;
        let on_top = j == n - 1 || up(j);
        let round = if on_top {
            p.rounds[j].clone()
        } else {
            // Sheaves of the moving block are sheaves (a guide cannot ride a block here).
            match p.rounds[j] {
                Round::Guide { .. } => Round::Rated(1.05),
                ref r => r.clone(),
            }
        };
        let (mut rest, mass) = round_text(&round);
        if !on_top {
            rest += ", block: hook";
            hook_mass += mass;
        }
        parts.push(PartSpec {
            name: name.clone(),
            at: [x, 0.0, p.heights[j] + if on_top { top } else { bottom }],
            axle: Some([0.0, 1.0, 0.0]),
            moves: None,
            pull: None,
            rest,
        });
        path.push(name);
    }
    // Straight below the last sheave's leaving tangent when unjittered.
    let x_end = n as f64 * a + p.jitter[n - 1] * a;
    let mut lines = Vec::new();
    let mut runner_mass = 0.0;
    if p.compound {
        parts.push(PartSpec {
            name: "runner".into(),
            at: [x_end, 0.0, 2.5],
            axle: None,
            moves: Some([0.0, 0.0, -1.0]),
            pull: None,
            rest: "kind: block, load: {force: 0.0}".into(),
        });
        path.push("runner".into());
        lines.push(("main".to_string(), path.join(", ")));
        runner_mass = p.runner_mass;
        parts.push(PartSpec {
            name: "runner.s".into(),
            at: [x_end + 0.3, 0.0, 1.5],
            axle: Some([0.0, 1.0, 0.0]),
            moves: None,
            pull: None,
            rest: format!(
                "kind: sheave, diameter: 0.19, mass: {:?}, block: runner, bearing: {{kind: rated, factor: 1.07}}",
                p.runner_mass
            ),
        });
        parts.push(PartSpec {
            name: "floor".into(),
            at: [x_end + 0.2, 0.0, -1.0],
            axle: None,
            moves: None,
            pull: None,
            rest: "kind: anchor".into(),
        });
        parts.push(haul(x_end + 0.4, -0.5, p));
        lines.push((
            "runner.fall".to_string(),
            format!("floor, runner.s, {}", haul_entry(p)),
        ));
    } else {
        parts.push(haul(x_end, 2.5, p));
        path.push(haul_entry(p));
        lines.push(("main".to_string(), path.join(", ")));
    }
    let solve_for = if p.load_unknown { "hook" } else { "haul" }.to_string();
    (
        RigSpec {
            gravity: [0.0, 0.0, -1.0],
            parts,
            lines,
            solve_for,
        },
        Masses {
            hook: hook_mass,
            runner: runner_mass,
        },
    )
}

/// The drive: a haul end at (x, z), or a drum (axle −y, pitch radius 0.1 m) whose
/// side at x takes the rope coming down.
fn haul(x: f64, z: f64, p: &Params) -> PartSpec {
    if let Some((shaft, mass)) = &p.drum {
        let torque = if p.load_unknown {
            format!(
                ", torque: {:?}",
                0.1 * p.load_mass * STANDARD_GRAVITY / p.n as f64
            )
        } else {
            String::new()
        };
        return PartSpec {
            name: "haul".into(),
            at: [x + 0.1, 0.0, z],
            axle: Some([0.0, -1.0, 0.0]),
            moves: None,
            pull: None,
            rest: format!("kind: drum, diameter: 0.19, mass: {mass:?}{torque}{shaft}"),
        };
    }
    let force = if p.load_unknown {
        // Roughly what it takes, so the checks have a stated drive.
        format!(", force: {:?}", p.load_mass * STANDARD_GRAVITY / p.n as f64)
    } else {
        String::new()
    };
    PartSpec {
        name: "haul".into(),
        at: [x, 0.0, z],
        axle: None,
        moves: None,
        pull: p.pull_given.then_some([0.0, 0.0, -1.0]),
        rest: format!("kind: haul{force}"),
    }
}

fn haul_entry(p: &Params) -> String {
    if p.drum.is_some() {
        "{part: haul, side: left}".into()
    } else {
        "haul".into()
    }
}

fn drum_strategy() -> impl Strategy<Value = Option<(String, f64)>> {
    let shaft = prop_oneof![
        Just(String::new()),
        (0.01..0.05f64, 0.05..0.3f64).prop_map(|(pin, mu)| format!(
            ", shaft: {{bearing: {{kind: plain, pin_diameter: {pin:?}, mu: {mu:?}}}}}"
        )),
        (
            0.01..0.05f64,
            0.001..0.004f64,
            0.0..500.0f64,
            0.02..0.08f64,
            any::<bool>()
        )
            .prop_map(|(bore, mu, load, d, worn)| format!(
                ", shaft: {{bearing: {{kind: rolling, bore: {bore:?}, mu: {mu:?}}}, \
                 thrust: {{load: {load:?}, diameter: {d:?}, mu: 0.1, contact: {}}}}}",
                if worn { "worn" } else { "new" }
            )),
    ];
    prop_oneof![Just(None), (shaft, 0.0..20.0f64).prop_map(Some)]
}

fn round_strategy(with_mass: bool) -> impl Strategy<Value = Round> {
    let mass = if with_mass { 0.0..3.0 } else { 0.0..1e-300 };
    let mass = mass.prop_map(|m: f64| if m < 1e-200 { 0.0 } else { m });
    prop_oneof![
        (1.0..1.12f64).prop_map(Round::Rated),
        (0.005..0.04f64, 0.02..0.3f64, mass.clone()).prop_map(|(pin, mu, mass)| Round::Plain {
            pin,
            mu,
            mass
        }),
        (0.01..0.04f64, 0.0005..0.004f64, mass).prop_map(|(bore, mu, mass)| Round::Rolling {
            bore,
            mu,
            mass
        }),
        Just(Round::Free),
        (0.02..0.3f64).prop_map(|mu| Round::Guide { mu }),
    ]
}

pub(super) fn params_strategy(with_mass: bool) -> impl Strategy<Value = Params> {
    (1usize..=6)
        .prop_flat_map(move |n| {
            (
                Just(n),
                proptest::collection::vec(round_strategy(with_mass), n),
                proptest::collection::vec(-0.2..0.2f64, n),
                proptest::collection::vec(-0.5..0.5f64, n),
                20.0..500.0f64,
                any::<bool>(),
                0.0..2.0f64,
                any::<bool>(),
                drum_strategy(),
            )
        })
        .prop_map(
            |(n, rounds, jitter, heights, load_mass, compound, runner_mass, pull_given, drum)| {
                Params {
                    n,
                    rounds,
                    jitter,
                    heights,
                    load_mass,
                    compound,
                    runner_mass,
                    pull_given,
                    drum,
                    load_unknown: false,
                }
            },
        )
}

/// Tensions by (line name, span index) for every case.
fn tensions(text: &str, s: &Solution) -> BTreeMap<(String, usize, &'static str), f64> {
    let rig = load_str(text, "random.yaml").expect("loads");
    let mut out = BTreeMap::new();
    for (l, line) in rig.lines.enumerate() {
        for case in [Case::Ideal, Case::Forward, Case::Back] {
            for (j, t) in s.main().case(case).tension[l].iter().enumerate() {
                out.insert((line.name.clone(), j, case.name()), *t);
            }
        }
    }
    out
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 40, failure_persistence: None, .. ProptestConfig::default() })]

    /// Zero friction equals the virtual-work answer X = −(v·Q)/(v·x): for the N-part
    /// tackle the hook rises at 1/N (1/(2N) under a runner, which itself sinks at 1/2)
    /// per unit haul speed, so X = g (M_hook/(cN) − M_runner/2 [compound only]).
    /// Independent of the friction inputs: the ideal case ignores them, and with every
    /// bearing removed forward and back equal it too.
    #[test]
    fn zero_friction_is_virtual_work(p in params_strategy(true)) {
        // Falls exactly vertical (random heights, no sideways jitter).
        let mut p = p;
        p.jitter.iter_mut().for_each(|j| *j = 0.0);
        let (spec, masses) = build(&p);
        let c = if p.compound { 2.0 } else { 1.0 };
        let expected = STANDARD_GRAVITY
            * (masses.hook / (c * p.n as f64) - if p.compound { masses.runner / 2.0 } else { 0.0 });
        // A drum winding the hauling part needs the pull times its pitch radius 0.1 m.
        let expected = if p.drum.is_some() { 0.1 * expected } else { expected };
        let text = spec.plain();
        let (_, s) = solve_text(&text);
        let ideal = s.main().ideal.value;
        prop_assert!(relative_eq!(ideal, expected, epsilon = 1e-18, max_relative = 1e-9), "ideal {} vs virtual work {}\n{}", ideal, expected, text);
        // Strip every friction: forward = back = ideal.
        let mut frictionless = spec.clone();
        for part in &mut frictionless.parts {
            if part.rest.starts_with("kind: drum") {
                let mass = p.drum.as_ref().map_or(0.0, |d| d.1);
                part.rest = format!("kind: drum, diameter: 0.19, mass: {mass:?}");
            } else if part.rest.contains("bearing") {
                let mass = part.rest.split("mass: ").nth(1).and_then(|r| r.split(',').next()).unwrap_or("0.0").to_string();
                let block = if part.rest.contains("block: hook") { ", block: hook" } else if part.rest.contains("block: runner") { ", block: runner" } else { "" };
                part.rest = format!("kind: sheave, diameter: 0.19, mass: {mass}, bearing: {{kind: none}}{block}");
            } else if part.rest.starts_with("kind: guide") {
                part.rest = "kind: guide, diameter: 0.19, mu: 0.0".into();
            }
        }
        let text = frictionless.plain();
        let (_, s) = solve_text(&text);
        let m = s.main();
        prop_assert!(relative_eq!(m.forward.value, expected, epsilon = 1e-18, max_relative = 1e-9), "frictionless forward {} vs {}\n{}", m.forward.value, expected, text);
        prop_assert!(relative_eq!(m.back.value, expected, epsilon = 1e-18, max_relative = 1e-9), "frictionless back {} vs {}\n{}", m.back.value, expected, text);
    }

    /// The energy audit balances to round-off in every case, and the fixed point
    /// settles.
    #[test]
    fn energy_audit_balances(p in params_strategy(true)) {
        let text = build(&p).0.plain();
        let (_, s) = solve_text(&text);
        for sub in &s.subrigs {
            for case in [&sub.ideal, &sub.forward, &sub.back] {
                prop_assert!(case.audit_residual < 1e-9, "{}: audit residual {}\n{}", case.case.name(), case.audit_residual, text);
                prop_assert!(matches!(case.status, Status::Converged { .. }), "{}: {:?}\n{}", case.case.name(), case.status, text);
                let loss: f64 = case.loss.iter().sum();
                let load: f64 = case.load_power.iter().sum();
                prop_assert!(relative_eq!(case.drive_power, load + loss, epsilon = 1e-18, max_relative = 1e-9),
                    "{}: drive {} vs load {} + loss {}", case.case.name(), case.drive_power, load, loss);
                for (part, l) in case.loss.iter().enumerate() {
                    prop_assert!(*l >= -1e-9 * case.drive_power.abs(), "{}: negative loss {} at part {}", case.case.name(), l, part);
                }
            }
        }
    }

    /// Friction never helps the drive: forward ≥ ideal ≥ back for a drive unknown;
    /// forward ≤ ideal ≤ back for a load unknown (DESIGN.md §3).
    #[test]
    fn friction_never_helps(p in params_strategy(true), load_unknown in any::<bool>()) {
        let mut p = p;
        p.load_unknown = load_unknown;
        let text = build(&p).0.plain();
        let (_, s) = solve_text(&text);
        let m = s.main();
        let (i, f, b) = (m.ideal.value, m.forward.value, m.back.value);
        let slack = 1e-12 * i.abs();
        if load_unknown {
            prop_assert!(f <= i + slack && i <= b + slack, "load unknown: forward {} ideal {} back {}\n{}", f, i, b, text);
        } else {
            prop_assert!(f >= i - slack && i >= b - slack, "drive unknown: forward {} ideal {} back {}\n{}", f, i, b, text);
        }
    }

    /// Without sheave weights every passage's ratio is load-independent, so the ratio
    /// along the path in the forward case is the inverse of the one running back:
    /// (T_after/T_before)_forward · (T_after/T_before)_back = 1, and the reported
    /// tight/slack ratio is the same in both cases.
    #[test]
    fn ratios_invert_between_forward_and_back(p in params_strategy(false)) {
        let text = build(&p).0.plain();
        let (_, s) = solve_text(&text);
        let m = s.main();
        let rig = load_str(&text, "random.yaml").expect("loads");
        for (l, line) in rig.lines.enumerate() {
            for e in 1..line.path.len() - 1 {
                let along = |c: &reeve::solve::CaseResult| c.tension[l][e] / c.tension[l][e - 1];
                let product = along(&m.forward) * along(&m.back);
                prop_assert!(relative_eq!(product, 1.0, epsilon = 1e-18, max_relative = 1e-9), "line {} entry {}: k_f·k_b = {}\n{}", line.name, e, product, text);
                let (rf, rb) = (m.forward.ratio[l][e], m.back.ratio[l][e]);
                prop_assert!(rf.is_some() && rb.is_some(), "ratio reported");
                let (rf, rb) = (rf.unwrap_or(0.0), rb.unwrap_or(0.0));
                prop_assert!(rf >= 1.0 - 1e-12 && relative_eq!(rf, rb, epsilon = 1e-18, max_relative = 1e-9), "line {} entry {}: reported {} vs {}", line.name, e, rf, rb);
            }
        }
    }

    /// Rigid motion of the whole rig (positions, axles, gravity, `moves`, `pull`)
    /// changes no tension and no value.
    #[test]
    fn rigid_motion_changes_nothing(
        p in params_strategy(true),
        theta in 0.0..std::f64::consts::PI,
        phi in 0.0..std::f64::consts::TAU,
        angle in -3.0..3.0f64,
        shift in proptest::array::uniform3(-50.0..50.0f64),
    ) {
        let (spec, _) = build(&p);
        let parts: Vec<usize> = (0..spec.parts.len()).collect();
        let lines: Vec<usize> = (0..spec.lines.len()).collect();
        let base = spec.plain();
        let moved = spec.render(&Rigid::new(theta, phi, angle, shift), &parts, &lines);
        let (s0, s1) = (solve_text(&base).1, solve_text(&moved).1);
        for case in [Case::Ideal, Case::Forward, Case::Back] {
            let (a, b) = (s0.main().case(case).value, s1.main().case(case).value);
            prop_assert!(relative_eq!(a, b, epsilon = 1e-17, max_relative = 1e-8), "{}: {} vs {} after rigid motion\n{}", case.name(), a, b, moved);
        }
        let (t0, t1) = (tensions(&base, &s0), tensions(&moved, &s1));
        for (key, a) in &t0 {
            let b = t1[key];
            prop_assert!(relative_eq!(*a, b, epsilon = 1e-17, max_relative = 1e-8), "{:?}: {} vs {} after rigid motion", key, a, b);
        }
    }

    /// The order in which parts and lines are listed changes nothing.
    #[test]
    fn file_order_changes_nothing(
        p in params_strategy(true),
        seed in proptest::collection::vec(any::<u32>(), 16),
        swap_lines in any::<bool>(),
    ) {
        let (spec, _) = build(&p);
        let count = spec.parts.len();
        let mut parts: Vec<usize> = (0..count).collect();
        // Fisher–Yates driven by the random seed words.
        for i in (1..count).rev() {
            let j = seed[i % seed.len()] as usize % (i + 1);
            parts.swap(i, j);
        }
        let mut lines: Vec<usize> = (0..spec.lines.len()).collect();
        if swap_lines {
            lines.reverse();
        }
        let base = spec.plain();
        let shuffled = spec.render(&Rigid::identity(), &parts, &lines);
        let (s0, s1) = (solve_text(&base).1, solve_text(&shuffled).1);
        for case in [Case::Ideal, Case::Forward, Case::Back] {
            let (a, b) = (s0.main().case(case).value, s1.main().case(case).value);
            prop_assert!(relative_eq!(a, b, epsilon = 1e-19, max_relative = 1e-10), "{}: {} vs {} after reordering\n{}", case.name(), a, b, shuffled);
        }
        let (t0, t1) = (tensions(&base, &s0), tensions(&shuffled, &s1));
        for (key, a) in &t0 {
            let b = t1[key];
            prop_assert!(relative_eq!(*a, b, epsilon = 1e-19, max_relative = 1e-10), "{:?}: {} vs {} after reordering", key, a, b);
        }
    }

    /// Virtual work in 3-D for a rope straight from a block to a haul: the block moves
    /// along `m`, its load is M g ĝ, the rope runs along u, the haul is pulled along p.
    /// A unit haul speed lengthens the rope by p·u, so the block moves (p·u)/(m·u) and
    /// X = −M g (ĝ·m)(p·u)/(m·u) (hand derivation from the virtual-work principle).
    #[test]
    fn straight_rope_virtual_work_3d(
        block in proptest::array::uniform3(-2.0..2.0f64),
        hand in proptest::array::uniform3(-2.0..2.0f64),
        moves in proptest::array::uniform3(-1.0..1.0f64),
        pull in proptest::array::uniform3(-1.0..1.0f64),
        gravity in proptest::array::uniform3(-1.0..1.0f64),
        mass in 1.0..100.0f64,
    ) {
        let norm = |v: V3| (v[0] * v[0] + v[1] * v[1] + v[2] * v[2]).sqrt();
        let unit = |v: V3| { let n = norm(v); [v[0] / n, v[1] / n, v[2] / n] };
        let dot = |a: V3, b: V3| a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
        let d = [hand[0] - block[0], hand[1] - block[1], hand[2] - block[2]];
        prop_assume!(norm(d) > 0.5 && norm(moves) > 0.3 && norm(pull) > 0.3 && norm(gravity) > 0.3);
        let (u, m, p, g) = (unit(d), unit(moves), unit(pull), unit(gravity));
        prop_assume!(dot(m, u).abs() > 0.2 && dot(p, u).abs() > 0.2);
        let text = format!(
            "format: 1\ntitle: straight\nunits: {{length: m, force: N, mass: kg}}\ngravity: {}\n\
             ropes:\n  r: {{diameter: 0.01, mu: 0.2}}\nparts:\n\
             \x20 block: {{kind: block, at: {}, moves: {}, load: {{mass: {:?}}}}}\n\
             \x20 haul: {{kind: haul, at: {}, pull: {}}}\nlines:\n  l: {{rope: r, path: [block, haul]}}\n",
            vec_text(gravity), vec_text(block), vec_text(moves), mass, vec_text(hand), vec_text(pull)
        );
        let (_, s) = solve_text(&text);
        let expected = -mass * STANDARD_GRAVITY * dot(g, m) * dot(p, u) / dot(m, u);
        let ideal = s.main().ideal.value;
        prop_assert!(relative_eq!(ideal, expected, epsilon = 1e-18, max_relative = 1e-9), "ideal {} vs virtual work {}\n{}", ideal, expected, text);
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 200, failure_persistence: None, .. ProptestConfig::default() })]

    /// Friction of any size (μ up to 1000, up to 1000 extra turns, rated factors up to
    /// 1e12) never panics and never gives a number that is not finite: the solve
    /// either answers with finite figures or refuses with an error that names a part.
    #[test]
    fn huge_friction_never_panics_nor_gives_non_finite_figures(
        guides in proptest::collection::vec(
            (prop_oneof![0.0..1.0f64, 0.0..1000.0f64], prop_oneof![0u32..5, 0u32..=1000]),
            1..4,
        ),
        factor_exponent in prop_oneof![0.0..0.1f64, 0.0..12.0f64],
        rope_mu in prop_oneof![0.0..1.0f64, 0.0..500.0f64],
    ) {
        let mut text = format!(
            "format: 1\nunits: {{length: mm, force: N, mass: kg}}\nropes:\n  c: {{diameter: 4, mu: {rope_mu:?}}}\nparts:\n\
             \x20 hand: {{kind: haul, at: [0, 0, -500], pull: [0, 0, -1]}}\n\
             \x20 s: {{kind: sheave, at: [0, 0, 0], axle: [0, 1, 0], diameter: 60, bearing: {{kind: rated, factor: {:?}}}}}\n",
            10f64.powf(factor_exponent)
        );
        let mut path = vec!["hand".to_string(), "{part: s, side: right}".to_string()];
        for (i, (mu, turns)) in guides.iter().enumerate() {
            let z = if i % 2 == 0 { 200.0 } else { 0.0 };
            text.push_str(&format!(
                "  g{i}: {{kind: guide, at: [{}, 0, {z}], axle: [0, 1, 0], diameter: 20, mu: {mu:?}}}\n",
                100.0 * (i + 1) as f64
            ));
            path.push(format!("{{part: g{i}, turns: {turns}}}"));
        }
        text.push_str(&format!(
            "  bob: {{kind: weight, at: [{}, 0, -800], mass: 2}}\nlines:\n  l: {{rope: c, path: [{}, bob]}}\n",
            100.0 * (guides.len() + 1) as f64,
            path.join(", ")
        ));
        let rig = load_str(&text, "huge.yaml").unwrap_or_else(|e| panic!("{e}\n{text}"));
        match solve(&rig, &SolveOptions::default()) {
            Ok(s) => {
                for case in [Case::Ideal, Case::Forward, Case::Back] {
                    let c = s.main().case(case);
                    prop_assert!(c.value.is_finite(), "{}: {}\n{}", case.name(), c.value, text);
                    prop_assert!(c.tension.iter().flatten().all(|t| t.is_finite()), "{}\n{}", case.name(), text);
                }
            }
            Err(e) => {
                let message = e.to_string();
                prop_assert!(e.subject().1.is_some(), "unlocated: {}\n{}", message, text);
            }
        }
    }
}

#[test]
fn every_review_rig_balances_its_energy() {
    // Guards the energy audit and the inverse passage ratios on every small rig in
    // tests/rigs/review/ (drums, stalls, load unknowns, sub-rigs), not only on random
    // tackles.
    // DESIGN.md §3 step 5: drive power = load power + losses, to round-off, in every
    // case of every sub-rig; and where friction does not depend on the load (capstan
    // bars, no own weight) the tension ratio of a passage is the same forward and back
    // (k_forward · k_back = 1 as T_after/T_before).
    let dir = test_rig("review");
    let mut names: Vec<String> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n.ends_with(".yaml"))
        .collect();
    names.sort();
    assert!(names.len() >= 12, "{names:?}");
    for name in &names {
        let (_, s) = solve_test_rig(&format!("review/{name}"));
        audit_ok(&s);
    }
    for name in ["load-unknown-capstan.yaml", "two-subrigs.yaml"] {
        let (_, s) = solve_test_rig(&format!("review/{name}"));
        for sub in &s.subrigs {
            let mut passages = 0;
            for (l, entries) in sub.forward.ratio.iter().enumerate() {
                for (e, r) in entries.iter().enumerate() {
                    // A passage has a ratio in both cases, a line end in neither.
                    match (r, sub.back.ratio[LineId::new(l)][e]) {
                        (Some(f), Some(b)) => {
                            assert_rel(&format!("{name} {l} {e}"), *f, b, 1e-12);
                            passages += 1;
                        }
                        (None, None) => {}
                        other => panic!("{name} line {l} entry {e}: ratios {other:?}"),
                    }
                }
            }
            assert!(passages > 0, "{name}: a sub-rig without a passage ratio");
        }
    }
}
