// Typed results for the core: every fallible core call returns Result<T>.
// A failure carries the name of the offending field and a sentence a person can read,
// which names the accepted range (design.md: "refused with a message naming the field and
// the accepted range"). No NaN and no exception leaves the core's public API.
#pragma once

#include <cassert>
#include <string>
#include <utility>
#include <variant>

namespace tw {

struct Error {
  std::string field;    // e.g. "salinity", "alkalinity_umol_kg", "row 12: ph"
  std::string message;  // e.g. "salinity 60 is outside the accepted range 0 to 45"
};

template <class T>
class Result {
 public:
  Result(T value) : data_(std::move(value)) {}           // NOLINT: implicit on purpose
  Result(Error error) : data_(std::move(error)) {}       // NOLINT: implicit on purpose
  // A default-made value built in place (for hot paths that fill it and return it by NRVO).
  explicit Result(std::in_place_t) : data_(std::in_place_index<0>) {}

  bool ok() const { return std::holds_alternative<T>(data_); }
  explicit operator bool() const { return ok(); }

  const T& value() const& {
    assert(ok() && "Result::value() on an error");
    return std::get<T>(data_);
  }
  T& value() & {
    assert(ok() && "Result::value() on an error");
    return std::get<T>(data_);
  }
  T&& value() && {
    assert(ok() && "Result::value() on an error");
    return std::get<T>(std::move(data_));
  }
  const T& operator*() const& { return value(); }
  const T* operator->() const { return &value(); }
  T* operator->() { return &value(); }

  const Error& error() const {
    assert(!ok() && "Result::error() on a success");
    return std::get<Error>(data_);
  }

 private:
  std::variant<T, Error> data_;
};

// Result<void> stand-in.
struct Ok {};
using Status = Result<Ok>;

// Builds the usual "<field> <value> is outside the accepted range <lo> to <hi> <unit>" error.
Error out_of_range_error(const std::string& field, double value, double lo, double hi,
                         const std::string& unit);

// Checks lo <= value <= hi and that value is finite; returns the error above otherwise.
Status check_range(const std::string& field, double value, double lo, double hi,
                   const std::string& unit);

}  // namespace tw
