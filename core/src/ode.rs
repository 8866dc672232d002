//! ode (being written).
