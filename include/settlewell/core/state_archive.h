#pragma once

#include <mpi.h>

#include <cstdint>
#include <istream>
#include <map>
#include <optional>
#include <ostream>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

namespace settlewell {

/// The state of a run's parts (step counter, monitors' histories, open files) in a
/// checkpoint, saved and loaded by one function per part, so that the two can never
/// disagree:
///
///   void visit(StateArchive& a, Part& p) { a & p.count & p.history; }
///
/// Numbers are kept bit for bit (a resumed run continues from exactly the values
/// it stopped with). A `visit` for a type goes into that type's namespace. The
/// archive also carries the run folder and communicator, for parts that reopen
/// files when loaded.
class StateArchive {
public:
  /// An archive that saves into `out`.
  StateArchive(std::ostream& out, std::string folder, MPI_Comm comm);
  /// An archive that loads from `in`; a short or damaged checkpoint throws
  /// InputError naming `source`.
  StateArchive(std::istream& in, std::string source, std::string folder, MPI_Comm comm);

  bool loading() const { return in_ != nullptr; }
  const std::string& folder() const { return folder_; }
  MPI_Comm comm() const { return comm_; }

  /// Saves or loads `size` bytes at `data`.
  void bytes(void* data, std::size_t size);
  /// Saves a mark, or checks that the same mark is where it is expected: catches
  /// a checkpoint from another version of a part early, with the part's name.
  void mark(const std::string& part);

  template <class T>
  StateArchive& operator&(T& value) {
    visit(*this, value);
    return *this;
  }

private:
  std::ostream* out_ = nullptr;
  std::istream* in_ = nullptr;
  std::string source_, folder_;
  MPI_Comm comm_;
};

template <class T>
std::enable_if_t<std::is_arithmetic_v<T> || std::is_enum_v<T>> visit(StateArchive& a,
                                                                     T& value) {
  a.bytes(&value, sizeof value);
}

void visit(StateArchive& a, std::string& text);
void visit(StateArchive& a, std::vector<bool>& flags);

/// The size of a container, checked on loading against a bound that no real
/// checkpoint reaches, so that a damaged one fails cleanly.
std::uint64_t visit_size(StateArchive& a, std::uint64_t size);

template <class T>
void visit(StateArchive& a, std::vector<T>& items) {
  items.resize(visit_size(a, items.size()));
  for (auto& item : items)
    a& item;
}

template <class K, class V>
void visit(StateArchive& a, std::map<K, V>& items) {
  const std::uint64_t n = visit_size(a, items.size());
  if (!a.loading()) {
    for (auto& [key, value] : items) {
      K k = key;
      a& k& value;
    }
    return;
  }
  items.clear();
  for (std::uint64_t i = 0; i < n; ++i) {
    K key{};
    V value{};
    a& key& value;
    items.emplace(std::move(key), std::move(value));
  }
}

template <class A, class B>
void visit(StateArchive& a, std::pair<A, B>& p) {
  a& p.first& p.second;
}

template <class T>
void visit(StateArchive& a, std::optional<T>& item) {
  bool present = item.has_value();
  a& present;
  if (a.loading() && present != item.has_value()) {
    if (present)
      item.emplace();
    else
      item.reset();
  }
  if (present)
    a&* item;
}

} // namespace settlewell
