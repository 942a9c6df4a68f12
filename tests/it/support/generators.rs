//! Rig generators shared by the tests and the benchmarks: `benches/solve.rs` and
//! `benches/scale.rs` include this file by path, so it uses nothing but the standard
//! library (each bench uses only some of it, hence `dead_code`).
#![allow(dead_code)]

use std::fmt::Write as _;

/// A planar tackle of `sheaves` rated sheaves (K = 1.04), alternately moving (on the hook
/// block, below) and fixed (above), dead end on the fixed block, falls vertical, hook
/// load 500 kg. With an even count the hauling part leaves the fixed block (N = S =
/// `sheaves` parts), with an odd count it leaves the moving block upward (N = `sheaves` +
/// 1 parts, S = `sheaves`).
pub fn tackle(sheaves: usize) -> String {
    let mut yaml = String::from(
        "format: 1\nropes:\n  w: {diameter: 8, mu: 0.12}\nparts:\n  hook: {kind: block, at: [0, 0, 0], load: {mass: 500}}\n",
    );
    let mut path = Vec::new();
    let r = 50.0;
    // Sheaves alternate: upper at z = 3000, lower on the hook at z = 0, stepping in x.
    let mut x = 0.0;
    let _ = writeln!(yaml, "  dead: {{kind: anchor, at: [{}, 0, 3000]}}", x - r);
    path.push("dead".to_string());
    for i in 0..sheaves {
        let (name, z, block) = if i % 2 == 0 {
            (format!("low{i}"), 0.0, ", block: hook")
        } else {
            (format!("up{i}"), 3000.0, "")
        };
        let _ = writeln!(
            yaml,
            "  {name}: {{kind: sheave, at: [{x}, 0, {z}], axle: [0, 1, 0], diameter: 92, bearing: {{kind: rated, factor: 1.04}}{block}}}"
        );
        path.push(format!(
            "{{part: {name}, side: {}}}",
            if i % 2 == 0 { "right" } else { "left" }
        ));
        x += 2.0 * r;
    }
    // The hauling part leaves the last sheave: down from an upper one, up from a lower.
    let z_end = if sheaves % 2 == 0 { -500.0 } else { 3500.0 };
    let _ = writeln!(
        yaml,
        "  hand: {{kind: haul, at: [{}, 0, {z_end}]}}",
        x - 2.0 * r + r
    );
    path.push("hand".to_string());
    let _ = writeln!(
        yaml,
        "lines:\n  fall: {{rope: w, path: [{}]}}",
        path.join(", ")
    );
    yaml
}

/// A weight lifted over a zig-zag of `n` fixed guides (capstan friction at each), the
/// hand end pulled along its span.
pub fn chain(n: usize, mu: f64) -> String {
    let mut yaml = format!(
        "format: 1\nropes:\n  c: {{diameter: 2, mu: {mu}}}\nparts:\n  hand: {{kind: haul, at: [0, 0, -200]}}\n"
    );
    let mut path = vec!["hand".to_string()];
    for i in 0..n {
        let z = if i % 2 == 0 { 0.0 } else { 100.0 };
        let _ = writeln!(
            yaml,
            "  g{i}: {{kind: guide, at: [{}, 0, {z}], axle: [0, 1, 0], diameter: 10}}",
            i as f64 * 60.0
        );
        path.push(format!("g{i}"));
    }
    let _ = writeln!(
        yaml,
        "  bob: {{kind: weight, at: [{}, 0, -300], mass: 1}}",
        (n - 1) as f64 * 60.0 + 6.0
    );
    path.push("bob".to_string());
    let _ = writeln!(
        yaml,
        "lines:\n  cord: {{rope: c, path: [{}]}}",
        path.join(", ")
    );
    yaml
}

/// Standard gravity, m/s² (DESIGN.md §1), for the closed forms of the generated rigs.
pub const G: f64 = 9.80665;

/// The largest rig file the loader reads, bytes (mirrors the loader's 1 MiB cap;
/// `tests/it/generators.rs` checks that the loader agrees).
pub const MAX_RIG_BYTES: usize = 1 << 20;

/// Mass of each line set's batten (with its pipe and load) and of its arbor, kg.
pub const LINE_SET_BATTEN_KG: f64 = 180.0;
/// See [`LINE_SET_BATTEN_KG`].
pub const LINE_SET_ARBOR_KG: f64 = 170.0;

/// The pull each line set's operator has, N (a haul other than the asked one must
/// state its force).
pub const LINE_SET_PULL_N: f64 = 200.0;

/// `sets` independent theatre counterweight line sets in one file (our own scenario,
/// modelled on `rigs/line-set.yaml` with one lift line per set, so each set is
/// determinate). Set `i` is a sub-rig of 7 parts in the plane y = 0.2·i m: a batten (a
/// block rising, 180 kg) with one pick point, a loft sheave in the grid, a head sheave at
/// the side wall, the arbor (a 170 kg weight), a floor block and the operator's haul
/// end; 2 lines and 3 passages (loft, head, floor). Pitch radii are lined up so that every span is vertical
/// or level: wraps of exactly 90° at the loft and head sheaves and 180° at the floor
/// block. The drive is set 0's operator; every other set is driven by its own operator.
/// Every operator has [`LINE_SET_PULL_N`] available, so `check` reports a margin.
/// Ideal effort of each set (derived, virtual work: batten, arbor and operator move at
/// the same speed): `(180 − 170) kg · g` = 98.0665 N.
pub fn line_sets(sets: usize) -> String {
    let mut yaml = String::from(
        "format: 1\ntitle: Fly gallery of independent counterweight line sets\nunits: {length: m, force: N, mass: kg}\nropes:\n  lift: {kind: wire, diameter: 0.01, breaking_strength: 62 kN, mu: 0.12}\n  purchase: {kind: fibre, diameter: 0.019, breaking_strength: 45 kN, mu: 0.3}\nparts:\n",
    );
    let mut lines = String::new();
    for i in 0..sets {
        let y = (2 * i) as f64 / 10.0;
        let s = format!("s{i}.");
        // Pitch radii: loft (0.26 + 0.01)/2 = 0.135, head (0.3 + 0.01)/2 = 0.155, floor
        // (0.2 + 0.019)/2 = 0.1095; the head's top is level with the loft's top.
        let _ = writeln!(
            yaml,
            "  {s}batten: {{kind: block, at: [0, {y}, 3], moves: [0, 0, 1], load: {{mass: {LINE_SET_BATTEN_KG}}}}}\n  \
             {s}pick: {{kind: anchor, block: {s}batten, at: [-0.135, {y}, 3]}}\n  \
             {s}loft: {{kind: sheave, at: [0, {y}, 16], axle: [0, 1, 0], diameter: 0.26, mass: 6, bearing: {{kind: plain, pin_diameter: 0.025, mu: 0.1}}}}\n  \
             {s}head: {{kind: sheave, at: [7, {y}, 15.98], axle: [0, 1, 0], diameter: 0.3, bearing: {{kind: plain, pin_diameter: 0.03, mu: 0.1}}}}\n  \
             {s}arbor: {{kind: weight, at: [7.155, {y}, 4], mass: {LINE_SET_ARBOR_KG}}}\n  \
             {s}floor: {{kind: sheave, at: [7.2645, {y}, 0.3], axle: [0, 1, 0], diameter: 0.2, bearing: {{kind: plain, pin_diameter: 0.02, mu: 0.1}}}}\n  \
             {s}operator: {{kind: haul, at: [7.374, {y}, 1.2], force: {LINE_SET_PULL_N}}}"
        );
        let _ = writeln!(
            lines,
            "  {s}lift: {{rope: lift, path: [{s}pick, {s}loft, {s}head, {s}arbor]}}\n  \
             {s}purchase: {{rope: purchase, path: [{s}arbor, {s}floor, {s}operator]}}"
        );
    }
    yaml.push_str("lines:\n");
    yaml.push_str(&lines);
    yaml.push_str("drive: s0.operator\n");
    yaml
}

/// Rope passages (parts the rope runs over) of [`line_sets`]: 3 per set.
pub fn line_set_passages(sets: usize) -> usize {
    3 * sets
}

/// The largest `sets` whose [`line_sets`] file fits the loader's 1 MiB cap.
pub fn max_line_sets() -> usize {
    // The text grows with every set: bisect on its length.
    let (mut fits, mut too_big) = (1, 2);
    while line_sets(too_big).len() <= MAX_RIG_BYTES {
        fits = too_big;
        too_big *= 2;
    }
    while too_big - fits > 1 {
        let mid = (fits + too_big) / 2;
        if line_sets(mid).len() <= MAX_RIG_BYTES {
            fits = mid;
        } else {
            too_big = mid;
        }
    }
    fits
}

/// Hook load of [`cascade`], kg.
pub const CASCADE_LOAD_KG: f64 = 100.0;

/// A cascade of `pulleys` movable pulleys in one sub-rig (the "Spanish burton" of old
/// texts): the load (100 kg) hangs on block `c0`; the line over each block's sheave runs
/// from an anchor in the ceiling, under the sheave and up to the next block, whose pull
/// hangs on it; the last line runs up to the haul. Every span is vertical: each sheave's
/// wrap is exactly 180°. `bearing` is every sheave's bearing (`{kind: none}` for
/// frictionless, `{kind: rated, factor: K}` for the closed form below). Passages: one per
/// pulley.
///
/// Closed form (derived): let `F_i` be the pull that hangs on block `i` (`F_0 = W`) and
/// `T_s`, `T_t` the tensions of its line's anchor side and its far side. Equilibrium
/// of the block: `T_s + T_t = F_i`; the far side pulls the next block, `F_{i+1} = T_t`.
/// Going forward the rope runs over the sheave from the anchor side to the far side,
/// so the far side is tight: `T_t = K·T_s` (a rated sheave at 180° has tension ratio K,
/// DESIGN.md §1), hence `F_{i+1} = F_i·K/(1 + K)` and the effort is
/// `W·(K/(1 + K))^N`. Running back the anchor side is tight, `T_s = K·T_t`, and the back
/// value is `W·(1/(1 + K))^N`. Frictionless (K = 1) both are the ideal `W/2^N`; the
/// velocity ratio is `2^N`.
pub fn cascade(pulleys: usize, bearing: &str) -> String {
    // Tread 46 mm and rope 4 mm (D/d 11.5): pitch radius 25 mm. Block i+1 sits on the far side of
    // block i's sheave, `rise` mm above it.
    let (r, rise) = (25.0, 100.0);
    let top = rise * (pulleys as f64 + 10.0);
    let mut yaml = format!(
        "format: 1\ntitle: Cascade of {pulleys} movable pulleys\nropes:\n  w: {{diameter: 4, mu: 0.12}}\nparts:\n"
    );
    let mut lines = String::from("lines:\n");
    for i in 0..pulleys {
        let (x, z) = (r * i as f64, rise * i as f64);
        let load = if i == 0 {
            format!("{CASCADE_LOAD_KG}")
        } else {
            "0".to_string()
        };
        let next = if i + 1 == pulleys {
            let _ = writeln!(
                yaml,
                "  hand: {{kind: haul, at: [{}, 0, {}]}}",
                x + r,
                z + rise
            );
            "hand".to_string()
        } else {
            format!("c{}", i + 1)
        };
        let _ = writeln!(
            yaml,
            "  c{i}: {{kind: block, at: [{x}, 0, {z}], moves: [0, 0, 1], load: {{mass: {load}}}}}\n  \
             c{i}.s: {{kind: sheave, block: c{i}, at: [{x}, 0, {z}], axle: [0, 1, 0], diameter: 46, bearing: {bearing}}}\n  \
             a{i}: {{kind: anchor, at: [{}, 0, {top}]}}",
            x - r
        );
        let _ = writeln!(lines, "  l{i}: {{rope: w, path: [a{i}, c{i}.s, {next}]}}");
    }
    yaml.push_str(&lines);
    yaml.push_str("drive: hand\n");
    yaml
}

/// Load of [`serpentine`], kg.
pub const CHAIN_LOAD_KG: f64 = 1.0;

/// A weight (1 kg) lifted by a cord over a serpentine of `guides` fixed round guides
/// (pins: capstan friction `mu`, no rotation), alternately above and below, the cord
/// running straight up and down between them. Guide pitch radius 6 mm (diameter 10, cord
/// 2), centres 12 mm apart, so every span is vertical and every wrap is exactly 180°;
/// the last guide is an upper one, from which the weight hangs. The hand end pulls on
/// the first guide. Passages: one per guide.
///
/// Closed form (capstan equation, Euler–Eytelwein, DESIGN.md §1; Hibbeler, *Engineering
/// Mechanics: Statics*, §8.5): the cord turns through `Σφ = guides·π`, so with the weight
/// `W` the forward pull is `W·exp(μ·guides·π)` and the back value `W·exp(−μ·guides·π)`.
///
/// Unlike [`chain`] (a zig-zag whose wraps follow from the tangent geometry), the wraps
/// here are exact, so the closed form needs no geometry.
pub fn serpentine(guides: usize, mu: f64) -> String {
    let r = 6.0;
    let mut yaml = format!(
        "format: 1\ntitle: Cord over a serpentine of {guides} pins\nropes:\n  c: {{kind: cord, diameter: 2, mu: {mu}}}\nparts:\n"
    );
    // The last guide is an upper one: the first is upper when the count is odd. The hand
    // end hangs below an upper first guide, or stands above a lower one.
    let upper = |i: usize| (guides - 1 - i) % 2 == 0;
    let hand_z = if upper(0) { -300.0 } else { 400.0 };
    let _ = writeln!(yaml, "  hand: {{kind: haul, at: [{}, 0, {hand_z}]}}", -r);
    let mut path = vec!["hand".to_string()];
    for i in 0..guides {
        let z = if upper(i) { 100.0 } else { 0.0 };
        let _ = writeln!(
            yaml,
            "  g{i}: {{kind: guide, at: [{}, 0, {z}], axle: [0, 1, 0], diameter: 10}}",
            2.0 * r * i as f64
        );
        path.push(format!("g{i}"));
    }
    let _ = writeln!(
        yaml,
        "  bob: {{kind: weight, at: [{}, 0, -300], mass: {CHAIN_LOAD_KG}}}",
        2.0 * r * (guides as f64 - 1.0) + r
    );
    path.push("bob".to_string());
    let _ = writeln!(
        yaml,
        "lines:\n  cord: {{rope: c, path: [{}]}}",
        path.join(", ")
    );
    yaml
}

/// Sheaves of [`ranged_tackle`]: 20 passages.
pub const RANGED_TACKLE_SHEAVES: usize = 20;

/// The [`tackle`] of [`RANGED_TACKLE_SHEAVES`] (20) sheaves for `spread`, with 21 ranged
/// inputs: every sheave's factor uniform in `{min: 1.02, max: 1.06}` (nominal 1.04) and
/// the hook load normal `{mean: 500, sd: 25}` kg. Its nominal values are those of
/// `tackle(20)`, so its nominal pull is the handbook reeving formula's (DESIGN.md §1).
pub fn ranged_tackle() -> String {
    tackle(RANGED_TACKLE_SHEAVES)
        .replacen(
            "format: 1\n",
            "format: 1\ntitle: Twenty-part tackle with uncertain sheaves and load\n",
            1,
        )
        .replace("factor: 1.04", "factor: {min: 1.02, max: 1.06}")
        .replace("load: {mass: 500}", "load: {mass: {mean: 500, sd: 25}}")
}

/// Plain bearing of every sheave of [`tackles`]: bronze bush on a 10 mm pin.
pub const TACKLES_BEARING: &str = "{kind: plain, pin_diameter: 10, mu: 0.1}";

/// The pull each hand of [`tackles`] has, N.
pub const TACKLES_PULL_N: f64 = 3000.0;

/// `count` independent two-part tackles in one file (for `rank`): tackle `i` is drawn
/// like `tackle(2)` in the plane y = 500·i mm, names prefixed `t{i}.`: a 500 kg hook
/// block with sheave `lower`, a fixed sheave `upper`, the dead end on an anchor above,
/// falls vertical, every sheave on a plain bearing ([`TACKLES_BEARING`], tread 92 mm,
/// rope 8 mm), and its own haul with [`TACKLES_PULL_N`] available. The drive is
/// `t0.hand`. Passages: 2 per tackle.
///
/// Closed form of each (derived): the bearing's tension ratio at 180° wrap is
/// `K = (1 + ρ)/(1 − ρ)`, `ρ = r·sin(atan μ)/R` (friction circle, DESIGN.md §1), and
/// walking the fall from the dead end (`T`, `K·T`, `K²·T`, the first two holding the
/// hook: `T·(1 + K) = W`) the forward effort is `W·K²/(1 + K)`.
pub fn tackles(count: usize) -> String {
    let mut yaml = String::from(
        "format: 1\ntitle: Independent two-part tackles\nropes:\n  w: {diameter: 8, mu: 0.12}\nparts:\n",
    );
    let mut lines = String::from("lines:\n");
    for i in 0..count {
        let (t, y) = (format!("t{i}."), 500 * i);
        let sheave = "axle: [0, 1, 0], diameter: 92";
        let _ = writeln!(
            yaml,
            "  {t}hook: {{kind: block, at: [0, {y}, 0], load: {{mass: 500}}}}\n  \
             {t}dead: {{kind: anchor, at: [-50, {y}, 3000]}}\n  \
             {t}lower: {{kind: sheave, block: {t}hook, at: [0, {y}, 0], {sheave}, bearing: {TACKLES_BEARING}}}\n  \
             {t}upper: {{kind: sheave, at: [100, {y}, 3000], {sheave}, bearing: {TACKLES_BEARING}}}\n  \
             {t}hand: {{kind: haul, at: [150, {y}, -500], force: {TACKLES_PULL_N}}}"
        );
        let _ = writeln!(
            lines,
            "  {t}fall: {{rope: w, path: [{t}dead, {{part: {t}lower, side: right}}, {{part: {t}upper, side: left}}, {t}hand]}}"
        );
    }
    yaml.push_str(&lines);
    yaml.push_str("drive: t0.hand\n");
    yaml
}
