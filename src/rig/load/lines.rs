//! Resolution of one line: its rope and its path of part references.

use super::keys::{get, join, key_names, Kind, ENTRY_KEYS, LINE_KEYS, MOST_TURNS, SIDES};
use super::read::{hint_or_list, Names, Resolver};
use crate::model::{Line, PartId, PathEntry, RopeId, Side};
use crate::rig::file::{Entry, Node, Value};

pub(super) fn line(
    r: &mut Resolver,
    e: &Entry,
    rope_names: &[String],
    names: &Names,
) -> Option<Line> {
    let path = join("lines", &e.key);
    let node = &e.value;
    let entries = r.mapping(node, &path, "a line `{rope, path: [...]}`")?;
    r.keys(entries, &path, &key_names(LINE_KEYS), "a line");
    let rope = r
        .require(
            entries,
            "rope",
            &path,
            node.location,
            "the name of a rope from `ropes`",
        )
        .and_then(|n| {
            let p = join(&path, "rope");
            let name = r.text(n, &p, "the name of a rope from `ropes`")?;
            match rope_names.iter().position(|x| x == name) {
                Some(i) => Some(i),
                None => {
                    let hint = if r.is_full() {
                        String::new()
                    } else {
                        hint_or_list(name, rope_names)
                    };
                    r.report(
                        n.location,
                        p,
                        format!("no rope named `{name}` in `ropes`{hint}"),
                    );
                    None
                }
            }
        });
    let steps_node = r.require(
        entries,
        "path",
        &path,
        node.location,
        "the parts the line passes, from one end to the other",
    )?;
    let pp = join(&path, "path");
    let Value::Seq(items) = &steps_node.value else {
        r.report(
            steps_node.location,
            pp,
            format!(
                "expected a list of part names, found {}",
                steps_node.describe()
            ),
        );
        return None;
    };
    if items.len() < 2 {
        r.report(
            steps_node.location,
            pp,
            format!(
                "a line needs at least two path entries (its two ends), found {}",
                items.len()
            ),
        );
        return None;
    }
    let mut steps = Vec::new();
    let mut ok = true;
    for (i, item) in items.iter().enumerate() {
        let ip = format!("{pp}.{i}");
        let is_end = i == 0 || i + 1 == items.len();
        match path_entry(r, item, &ip, names, is_end) {
            Some(s) => steps.push(s),
            None => ok = false,
        }
    }
    Some(Line {
        name: e.key.clone(),
        rope: RopeId::new(rope?),
        path: ok.then_some(steps)?,
        location: e.key_location,
    })
}

pub(super) fn path_entry(
    r: &mut Resolver,
    item: &Node,
    path: &str,
    names: &Names,
    is_end: bool,
) -> Option<PathEntry> {
    let (name_node, fields) = match &item.value {
        Value::Map(fields) => {
            r.keys(fields, path, &key_names(ENTRY_KEYS), "a path entry");
            (
                r.require(fields, "part", path, item.location, "the part's name")?,
                Some(fields.as_slice()),
            )
        }
        _ => (item, None),
    };
    let part = r.part_ref(name_node, path, names, "in this line's path")?;
    let name = &names.names[part];
    let kind = names.kinds[part]?;
    let mut ok = true;
    if is_end && !kind.can_end() {
        r.report(name_node.location, path, format!("`{name}` is {}, which cannot end a line; a line ends at an anchor, block, weight, drum or haul", kind.a()));
        ok = false;
    }
    if !is_end && !kind.can_pass() {
        r.report(name_node.location, path, format!("`{name}` is {}, which a line cannot pass through; between its ends a line passes sheaves, guides and drums", kind.a()));
        ok = false;
    }
    let mut turns = 0;
    let mut side = None;
    if let Some(fields) = fields {
        if let Some(t) = get(fields, "turns") {
            let tp = join(path, "turns");
            let v = r.number(t, &tp, "a whole number of extra turns");
            match r.check(
                v,
                t,
                &tp,
                |v| (0.0..=MOST_TURNS).contains(&v) && v.fract() == 0.0,
                "a whole number of extra turns from 0 to 1000",
            ) {
                Some(v) if matches!(kind, Kind::Guide | Kind::Drum) => turns = v as u32,
                Some(_) => {
                    r.report(
                        t.location,
                        tp,
                        format!(
                            "`turns` applies only to a guide or drum; `{name}` is {}",
                            kind.a()
                        ),
                    );
                    ok = false;
                }
                None => ok = false,
            }
        }
        if let Some(s) = get(fields, "side") {
            match r.choice(s, &join(path, "side"), SIDES, "side") {
                Some(0) => side = Some(Side::Left),
                Some(_) => side = Some(Side::Right),
                None => ok = false,
            }
        }
    }
    ok.then_some(PathEntry {
        part: PartId::new(part),
        turns,
        side,
        location: item.location,
    })
}
