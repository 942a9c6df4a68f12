//! [`ById`]: one sub-rig's results keyed by the rig-wide part or line id, stored only
//! for the ids the sub-rig holds. A rig of many independent sub-rigs (a fly system of
//! a thousand line sets) then keeps results sized by each sub-rig, not by the rig
//! times the number of sub-rigs.

use std::ops::Index;
use std::sync::Arc;

use crate::model::Id;

/// Values at some ids of a rig-wide index (parts or lines), `absent` at every other id
/// below [`ById::len`]. Indexed like the `Vec` over every id it stands for: `x[id]`,
/// `x.get(id)` (None only past the end), `x.iter()` over every id in order; the ids it
/// stores are [`ById::entries`], which is what a loop over one sub-rig should walk.
#[derive(Debug, Clone, PartialEq)]
pub struct ById<I, T> {
    len: usize,
    /// Stored ids, ascending, each once (shared by a sub-rig's results).
    ids: Arc<[I]>,
    values: Vec<T>,
    absent: T,
}

impl<I: Id, T> ById<I, T> {
    /// `values[k]` at `ids[k]` among `len` ids, `absent` elsewhere.
    ///
    /// # Panics
    /// When `ids` is not strictly ascending, reaches `len`, or its length is not that of
    /// `values` (a bug in the solver, not bad input).
    pub fn new(len: usize, ids: impl Into<Arc<[I]>>, values: Vec<T>, absent: T) -> ById<I, T> {
        let ids = ids.into();
        assert_eq!(ids.len(), values.len(), "one value per id");
        assert!(
            ids.windows(2).all(|w| w[0] < w[1]),
            "ids ascending, each once"
        );
        assert!(
            ids.last().map_or(true, |&i| i.index() < len),
            "ids below len"
        );
        ById {
            len,
            ids,
            values,
            absent,
        }
    }

    /// [`ById::new`] on ids already checked where they were made (a sub-rig's
    /// [`super::Layout`] checks its keys once; every case of every run shares them):
    /// only the count of values is checked here, the rest in debug builds.
    ///
    /// # Panics
    /// When the length of `ids` is not that of `values`.
    pub(super) fn keyed(len: usize, ids: Arc<[I]>, values: Vec<T>, absent: T) -> ById<I, T> {
        assert_eq!(ids.len(), values.len(), "one value per id");
        debug_assert!(ids.windows(2).all(|w| w[0] < w[1]));
        debug_assert!(ids.last().map_or(true, |&i| i.index() < len));
        ById {
            len,
            ids,
            values,
            absent,
        }
    }

    /// How many ids it stands for (every part or line of the rig).
    pub fn len(&self) -> usize {
        self.len
    }

    /// Whether it stands for no id at all.
    pub fn is_empty(&self) -> bool {
        self.len == 0
    }

    /// The value at `id`, `absent` where none is stored; None past the end.
    pub fn get(&self, id: I) -> Option<&T> {
        if id.index() >= self.len {
            return None;
        }
        Some(match self.position(id) {
            Some(k) => &self.values[k],
            None => &self.absent,
        })
    }

    /// Every id's value in id order, `absent` included: as the `Vec` over every id.
    pub fn iter(&self) -> Iter<'_, I, T> {
        Iter {
            of: self,
            id: 0,
            next: 0,
        }
    }

    /// The stored ids and their values, in id order.
    pub fn entries(&self) -> impl Iterator<Item = (I, &T)> + '_ {
        self.ids.iter().copied().zip(&self.values)
    }

    fn position(&self, id: I) -> Option<usize> {
        // Most lookups of another sub-rig's id fall outside the stored range.
        match (self.ids.first(), self.ids.last()) {
            (Some(&lo), Some(&hi)) if (lo..=hi).contains(&id) => self.ids.binary_search(&id).ok(),
            _ => None,
        }
    }
}

/// [`ById::iter`]: every id's value in id order.
#[derive(Debug, Clone)]
pub struct Iter<'a, I, T> {
    of: &'a ById<I, T>,
    /// The next id.
    id: usize,
    /// The position in `ids` of the next stored id.
    next: usize,
}

impl<'a, I: Id, T> Iterator for Iter<'a, I, T> {
    type Item = &'a T;

    fn next(&mut self) -> Option<&'a T> {
        let of = self.of;
        if self.id >= of.len {
            return None;
        }
        let value = if of.ids.get(self.next).map(|i| i.index()) == Some(self.id) {
            self.next += 1;
            &of.values[self.next - 1]
        } else {
            &of.absent
        };
        self.id += 1;
        Some(value)
    }

    fn size_hint(&self) -> (usize, Option<usize>) {
        let left = self.of.len - self.id;
        (left, Some(left))
    }
}

impl<I: Id, T> ExactSizeIterator for Iter<'_, I, T> {}

/// `for x in &by_id` walks every id, as over the `Vec` it stands for.
impl<'a, I: Id, T> IntoIterator for &'a ById<I, T> {
    type Item = &'a T;
    type IntoIter = Iter<'a, I, T>;

    fn into_iter(self) -> Iter<'a, I, T> {
        self.iter()
    }
}

impl<I: Id, T> Index<I> for ById<I, T> {
    type Output = T;

    /// # Panics
    /// Past the end, as a `Vec` would.
    fn index(&self, id: I) -> &T {
        self.get(id).unwrap_or_else(|| {
            panic!(
                "index out of bounds: the len is {} but the index is {}",
                self.len,
                id.index()
            )
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::PartId;

    fn p(index: usize) -> PartId {
        PartId::new(index)
    }

    #[test]
    fn reads_as_the_vec_over_every_id() {
        let x = ById::new(6, vec![p(1), p(4)], vec![2.5, -1.0], 0.0);
        assert_eq!(
            x.iter().copied().collect::<Vec<_>>(),
            [0.0, 2.5, 0.0, 0.0, -1.0, 0.0]
        );
        assert_eq!((x[p(0)], x[p(1)], x[p(4)], x[p(5)]), (0.0, 2.5, -1.0, 0.0));
        assert_eq!(x.get(p(6)), None);
        assert_eq!(x.len(), 6);
        assert_eq!(
            x.entries().collect::<Vec<_>>(),
            [(p(1), &2.5), (p(4), &-1.0)]
        );
        let empty: ById<PartId, Vec<f64>> = ById::new(3, vec![], vec![], Vec::new());
        assert!(empty[p(2)].is_empty());
    }

    #[test]
    #[should_panic(expected = "index out of bounds")]
    fn past_the_end_panics_as_a_vec() {
        let x = ById::new(2, vec![p(0)], vec![1], 0);
        let _ = x[p(2)];
    }
}
