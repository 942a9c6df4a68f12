#!/usr/bin/env python3
"""Writes the seed corpus of the `structured` target: every rig of rigs/ and
tests/rigs/ with a few command sets (see fuzz_targets/structured.rs)."""
import glob, hashlib, os, sys
import yaml

target = sys.argv[1] if len(sys.argv) > 1 else "structured"
out = f"corpus/{target}"
os.makedirs(out, exist_ok=True)
rigs = sorted(glob.glob("../rigs/*.yaml") + glob.glob("../tests/rigs/**/*.yaml", recursive=True))
def commands_sweep(parts, ropes, sheave, block):
    out = []
    if sheave:
        out.append([f"sweep parts.{sheave}.bearing.mu=0.05..0.2"])
    if ropes:
        out.append([f"sweep ropes.{ropes[0]}.mu=0.1..0.3"])
    if block:
        out.append([f"sweep parts.{block}.load.mass=10 kg..80 kg"])
    return out


n = 0
for path in rigs:
    text = open(path, encoding="utf-8").read()
    try:
        doc = yaml.safe_load(text) or {}
    except Exception:
        doc = {}
    parts = doc.get("parts") or {}
    ropes = list((doc.get("ropes") or {}).keys())
    sheave = next((k for k, v in parts.items() if isinstance(v, dict) and v.get("kind") == "sheave"), None)
    block = next((k for k, v in parts.items() if isinstance(v, dict) and v.get("kind") == "block"), None)
    commands = [[], ["check"], ["table text all both", "table csv forward parts", "table json back spans"],
                ["draw iso", "html auto"], ["draw front"], ["draw top"], ["variants text"],
                ["compare json"], ["stroke 50 mm 3 text"], ["stroke -20 2 json"],
                ["rank md rolling"], ["rank json {kind: plain, pin_diameter: 8 mm, mu: 0.08}"],
                ["spread 4 1 text"], ["spread 3 7 json"]]
    sets = [[]]
    if sheave:
        commands.append([f"sweep parts.{sheave}.bearing.mu=0.05..0.2 4 csv"])
        sets.append([f"set parts.{sheave}.bearing={{kind: rolling, bore: 8, mu: 0.002}}"])
        sets.append([f"set parts.{sheave}.bearing.mu={{min: 0.05, max: 0.2}}"])
    if ropes:
        commands.append([f"sweep ropes.{ropes[0]}.mu=0.1..0.3 3 json"])
        sets.append([f"set ropes.{ropes[0]}.mu={{mean: 0.2, sd: 0.02}}"])
    if block:
        commands.append([f"sweep parts.{block}.load.mass=10 kg..80 kg 3 text"])
        sets.append([f"set parts.{block}.load.mass=25 kg"])
    sets.append(["set limits.fleet_angle=0.5", "set gravity=[0, 0, -1]"])
    if target == "settings":
        # The settings target reads `set`, `to` and `vary` lines only.
        commands = [[], ["variants"], ["ranges"], ["frictionless"], ["to rolling"], ["to {kind: plain, pin_diameter: 8 mm, mu: 0.08}"],
                    ["to {kind: rated, efficiency: 0.95}"]]
        commands += [["vary " + c[0][len("sweep "):]] for c in commands_sweep(parts, ropes, sheave, block)]
    if target == "files":
        # One layout and one command each (`#% out`, `#% cmd`), no overrides.
        outs = ["same", "symlink", "hardlink", "dotdot", "new", "existing", "dangling", "folder"]
        cmds = ["table", "draw", "report", "plot"]
        commands = [[f"out {o}", f"cmd {c}"] for o in outs for c in cmds]
        sets = [[]]
    for c in commands:
        for s in (sets if not c or c[0].split()[0] in ("check", "compare", "spread", "rank", "to", "ranges") else sets[:1]):
            body = text.rstrip("\n") + "\n" + "".join(f"#% {x}\n" for x in s + c)
            name = hashlib.sha1(body.encode()).hexdigest()
            with open(os.path.join(out, name), "w", encoding="utf-8") as f:
                f.write(body)
            n += 1
print(f"{n} seeds from {len(rigs)} rigs in {out}")
