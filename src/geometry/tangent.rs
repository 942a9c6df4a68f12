//! Tangent lines between circles (and points) in 3-D.
