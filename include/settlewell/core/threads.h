#pragma once

namespace settlewell {

/// One BLAS thread per process, set before any factorisation.
///
/// OpenBLAS reads OPENBLAS_NUM_THREADS when the library is loaded, before main()
/// can set it, and its idle worker spins on sched_yield: on two cores it took a
/// quarter of the demo's CPU time and competes with a second MPI process. The
/// setting is made through the library's own call when the loaded BLAS has one
/// (looked up at run time, so another BLAS links as well). The variable
/// SETTLEWELL_BLAS_THREADS, if set, gives another count.
void limit_blas_threads();

} // namespace settlewell
