//! The rope as a material in one sub-rig's statics (DESIGN.md §7): the load split by
//! compatibility of stretch where lines share a block, and the spring rate at the
//! drive; the mechanics are [`super::super::elastic`]'s, on the sub-rig's own arrays
//! (segments with their local lines, coefficients by local line).

use super::*;

impl Problem<'_> {
    /// The load split by compatibility of stretch ([`crate::solve::elastic::compatible_split`])
    /// when every rope of the sub-rig has a `stiffness`; else the least-squares
    /// `solution` as it is. Also whether the stiffness fixed the split.
    pub(super) fn stiffness_split(
        &self,
        mat: &DMatrix<Real>,
        column_norms: &[Real],
        coef: &[Vec<(Real, Real)>],
        solution: DVector<Real>,
        options: &SolveOptions,
    ) -> (DVector<Real>, bool) {
        let input = crate::solve::elastic::SplitInput {
            rig: self.rig,
            geometry: self.geometry,
            kin: self.kin,
            segs: &self.layout.segs,
            seg_line: &self.layout.seg_line,
            dofs: &self.layout.dofs,
            coef,
            rise: &|l, j| self.layout.weight.rise(l, j),
        };
        match crate::solve::elastic::compatible_split(
            &input,
            mat,
            column_norms,
            &solution,
            options.rank_tolerance,
            options.motion_tolerance,
        ) {
            Some((x, fixed)) => (x, fixed),
            None => (solution, false),
        }
    }

    /// The rig's spring rate at the drive ([`crate::solve::elastic::drive_stiffness`]):
    /// every part with a load (or the asked quantity) held, the others free.
    pub fn drive_stiffness(&self) -> Option<Real> {
        crate::solve::elastic::drive_stiffness(&self.spring_input()?)
    }

    /// The lost travel at the drive from the just-taut to the loaded rig, by the
    /// unit-load method over the stretches of `case`
    /// ([`crate::solve::elastic::lost_travel`]).
    pub fn lost_travel(&self, case: &CaseResult) -> Option<Real> {
        let ea = |l: LineId| self.rig.rope_of(l).stiffness;
        crate::solve::elastic::lost_travel(&self.spring_input()?, |l, j| {
            let (a, b) = (case.tension[l].get(j)?, case.tension_end[l].get(j)?);
            let s = &self.geometry.lines[l].spans[j];
            Some(crate::solve::elastic::span_stretch(
                *a,
                *b,
                s.length,
                ea(l)?,
            ))
        })
    }

    /// What the spring solve needs: the sub-rig's segments and motions, the drive's
    /// motion, and which motions are held (a part with a load, or the asked quantity).
    fn spring_input(&self) -> Option<crate::solve::elastic::SpringInput<'_>> {
        let drive = self
            .layout
            .dofs
            .iter()
            .position(|&i| self.kin.dofs[i].part == self.drive)?;
        let held: Vec<bool> = (0..self.layout.dofs.len())
            .map(|k| {
                self.q_load[k] != 0.0 || self.x_coef[k] != 0.0 || self.layout.rope_load[k] != 0.0
            })
            .collect();
        Some(crate::solve::elastic::SpringInput {
            rig: self.rig,
            geometry: self.geometry,
            kin: self.kin,
            segs: &self.layout.segs,
            dofs: &self.layout.dofs,
            drive,
            held,
        })
    }

    /// The lines of the sub-rig.
    pub fn lines(&self) -> &[LineId] {
        &self.layout.lines
    }
}
