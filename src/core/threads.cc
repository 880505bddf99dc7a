#include "settlewell/core/threads.h"

#include <algorithm>
#include <cstdlib>
#include <dlfcn.h>

namespace settlewell {

void limit_blas_threads() {
  int count = 1;
  if (const char* given = std::getenv("SETTLEWELL_BLAS_THREADS"))
    count = std::max(1, std::atoi(given));
  using SetThreads = void (*)(int);
  for (const char* name : {"openblas_set_num_threads", "goto_set_num_threads"})
    if (void* found = dlsym(RTLD_DEFAULT, name)) {
      reinterpret_cast<SetThreads>(found)(count);
      return;
    }
}

} // namespace settlewell
