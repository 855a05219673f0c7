//! Small dense complex linear algebra, written here so the crate needs no
//! linear-algebra dependency (keeps the WebAssembly build small).

pub mod complex_qr_eigen;
pub mod jacobi_svd;
