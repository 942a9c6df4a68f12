//! Typed ids of the resolved rig: [`PartId`], [`LineId`], [`RopeId`], each a position in
//! its collection of [`super::Rig`] (file order) and a type of its own, so that the
//! compiler tells a part from a line or a rope; and [`IdVec`], a `Vec` indexed by one of
//! them (`rig.parts[id]`), which the model's collections and the per-part and per-line
//! tables of the later stages use. A block is a part ([`super::PartKind::Block`]), so
//! it has no id type of its own. Ids never reach the JSON: reports name parts and lines.

use std::fmt;
use std::marker::PhantomData;
use std::ops::{Index, IndexMut};

/// A typed position in one of the rig's collections.
pub trait Id: Copy + Ord + fmt::Debug {
    /// The id of position `index`.
    ///
    /// # Panics
    /// Beyond 2³² items, which no rig file reaches (files are capped in size).
    fn new(index: usize) -> Self;

    /// The position.
    fn index(self) -> usize;
}

macro_rules! id_type {
    ($(#[$doc:meta])* $name:ident, $items:literal) => {
        $(#[$doc])*
        #[derive(Copy, Clone, Eq, PartialEq, Ord, PartialOrd, Hash, Debug)]
        pub struct $name(u32);

        impl $name {
            #[doc = concat!("The id of position `index` in the rig's ", $items, ".")]
            ///
            /// # Panics
            /// Beyond 2³² of them, which no rig file reaches (files are capped in size).
            pub const fn new(index: usize) -> Self {
                assert!(index <= u32::MAX as usize, concat!("fewer than 2^32 ", $items));
                Self(index as u32)
            }

            #[doc = concat!("The position in the rig's ", $items, ".")]
            pub fn index(self) -> usize {
                self.0 as usize
            }
        }

        impl Id for $name {
            fn new(index: usize) -> Self {
                $name::new(index)
            }

            fn index(self) -> usize {
                $name::index(self)
            }
        }

        impl From<$name> for usize {
            fn from(id: $name) -> usize {
                id.index()
            }
        }
    };
}

id_type!(
    /// A part: its position in [`super::Rig::parts`] (file order).
    PartId,
    "parts"
);
id_type!(
    /// A line: its position in [`super::Rig::lines`] (file order).
    LineId,
    "lines"
);
id_type!(
    /// A rope: its position in [`super::Rig::ropes`] (file order).
    RopeId,
    "ropes"
);

/// A `Vec` indexed by an id type `I` (`parts[id]`), one item per id from 0, in id order.
/// The rig's parts, lines and ropes are kept in these, and so are the later stages'
/// tables with one entry per part or per line.
#[derive(Clone, PartialEq)]
pub struct IdVec<I, T> {
    items: Vec<T>,
    id: PhantomData<fn() -> I>,
}

impl<I: Id, T> IdVec<I, T> {
    /// An empty one.
    pub fn new() -> Self {
        IdVec::from(Vec::new())
    }

    /// `n` copies of `value`, for ids 0 to n − 1.
    pub fn filled(value: T, n: usize) -> Self
    where
        T: Clone,
    {
        IdVec::from(vec![value; n])
    }

    /// How many ids it holds.
    pub fn len(&self) -> usize {
        self.items.len()
    }

    /// Whether it holds none.
    pub fn is_empty(&self) -> bool {
        self.items.is_empty()
    }

    /// The item at `id`, None past the end.
    pub fn get(&self, id: I) -> Option<&T> {
        self.items.get(id.index())
    }

    /// The item at `id` to change, None past the end.
    pub fn get_mut(&mut self, id: I) -> Option<&mut T> {
        self.items.get_mut(id.index())
    }

    /// Adds an item at the next id, which it returns.
    pub fn push(&mut self, item: T) -> I {
        self.items.push(item);
        I::new(self.items.len() - 1)
    }

    /// The items in id order.
    pub fn iter(&self) -> std::slice::Iter<'_, T> {
        self.items.iter()
    }

    /// The items in id order, to change.
    pub fn iter_mut(&mut self) -> std::slice::IterMut<'_, T> {
        self.items.iter_mut()
    }

    /// Every id, in order.
    pub fn ids(&self) -> impl DoubleEndedIterator<Item = I> + ExactSizeIterator {
        (0..self.items.len()).map(I::new)
    }

    /// Each id with its item, in id order.
    pub fn enumerate(&self) -> impl DoubleEndedIterator<Item = (I, &T)> + ExactSizeIterator {
        self.items.iter().enumerate().map(|(k, x)| (I::new(k), x))
    }

    /// The first id whose item satisfies `pred`.
    pub fn position(&self, pred: impl FnMut(&T) -> bool) -> Option<I> {
        self.items.iter().position(pred).map(I::new)
    }

    /// The items as a slice, in id order (position `k` is id `k`).
    pub fn as_slice(&self) -> &[T] {
        &self.items
    }

    /// The items as a `Vec`, in id order.
    pub fn into_vec(self) -> Vec<T> {
        self.items
    }
}

impl<I: Id, T> Default for IdVec<I, T> {
    fn default() -> Self {
        IdVec::new()
    }
}

impl<I, T: fmt::Debug> fmt::Debug for IdVec<I, T> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        self.items.fmt(f)
    }
}

impl<I, T> From<Vec<T>> for IdVec<I, T> {
    fn from(items: Vec<T>) -> Self {
        IdVec {
            items,
            id: PhantomData,
        }
    }
}

impl<I, T> FromIterator<T> for IdVec<I, T> {
    fn from_iter<It: IntoIterator<Item = T>>(iter: It) -> Self {
        IdVec::from(iter.into_iter().collect::<Vec<T>>())
    }
}

impl<I: Id, T> Index<I> for IdVec<I, T> {
    type Output = T;

    fn index(&self, id: I) -> &T {
        &self.items[id.index()]
    }
}

impl<I: Id, T> IndexMut<I> for IdVec<I, T> {
    fn index_mut(&mut self, id: I) -> &mut T {
        &mut self.items[id.index()]
    }
}

impl<'a, I, T> IntoIterator for &'a IdVec<I, T> {
    type Item = &'a T;
    type IntoIter = std::slice::Iter<'a, T>;

    fn into_iter(self) -> Self::IntoIter {
        self.items.iter()
    }
}

impl<'a, I, T> IntoIterator for &'a mut IdVec<I, T> {
    type Item = &'a mut T;
    type IntoIter = std::slice::IterMut<'a, T>;

    fn into_iter(self) -> Self::IntoIter {
        self.items.iter_mut()
    }
}

impl<I, T> IntoIterator for IdVec<I, T> {
    type Item = T;
    type IntoIter = std::vec::IntoIter<T>;

    fn into_iter(self) -> Self::IntoIter {
        self.items.into_iter()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn indexes_by_its_own_id_only() {
        let mut parts: IdVec<PartId, &str> = IdVec::new();
        let head = parts.push("head");
        let hook = parts.push("hook");
        assert_eq!((head.index(), hook.index()), (0, 1));
        assert_eq!(parts[hook], "hook");
        parts[head] = "crown";
        assert_eq!(
            parts.enumerate().collect::<Vec<_>>(),
            [(head, &"crown"), (hook, &"hook")]
        );
        assert_eq!(parts.position(|p| *p == "hook"), Some(hook));
        assert_eq!(parts.get(PartId::new(2)), None);
        assert_eq!(usize::from(hook), 1);
        assert_eq!(parts.ids().collect::<Vec<_>>(), [head, hook]);
    }
}
