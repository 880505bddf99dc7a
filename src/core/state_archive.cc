#include "settlewell/core/state_archive.h"

#include "settlewell/core/errors.h"

namespace settlewell {

StateArchive::StateArchive(std::ostream& out, std::string folder, MPI_Comm comm)
    : out_(&out)
    , folder_(std::move(folder))
    , comm_(comm) {}

StateArchive::StateArchive(std::istream& in,
                           std::string source,
                           std::string folder,
                           MPI_Comm comm)
    : in_(&in)
    , source_(std::move(source))
    , folder_(std::move(folder))
    , comm_(comm) {}

void StateArchive::bytes(void* data, std::size_t size) {
  if (out_) {
    out_->write(static_cast<const char*>(data), std::streamsize(size));
    return;
  }
  in_->read(static_cast<char*>(data), std::streamsize(size));
  if (std::size_t(in_->gcount()) != size)
    throw InputError(source_ + ": the checkpoint ends early; it is damaged");
}

void StateArchive::mark(const std::string& part) {
  std::string here = part;
  *this& here;
  if (loading() && here != part)
    throw InputError(source_ + ": expected the state of '" + part + "' but found '" +
                     here +
                     "'; the checkpoint is from another version of Settlewell "
                     "or damaged");
}

std::uint64_t visit_size(StateArchive& a, std::uint64_t size) {
  a.bytes(&size, sizeof size);
  // No part of a run keeps more than a few hundred million items.
  if (a.loading() && size > (std::uint64_t(1) << 32))
    throw InputError("a size in the checkpoint is out of range; it is damaged");
  return size;
}

void visit(StateArchive& a, std::string& text) {
  text.resize(visit_size(a, text.size()));
  if (!text.empty())
    a.bytes(text.data(), text.size());
}

void visit(StateArchive& a, std::vector<bool>& flags) {
  flags.resize(visit_size(a, flags.size()));
  for (std::size_t i = 0; i < flags.size(); ++i) {
    bool flag = flags[i];
    a& flag;
    flags[i] = flag;
  }
}

} // namespace settlewell
