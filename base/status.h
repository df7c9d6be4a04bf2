// Status and Result<T>: expected failures as values.
//
// The core never throws for bad input or numerical trouble; it returns a
// Status (ok or an error message) or a Result<T> (a value or a Status).
// Assertions remain for programmer errors only.
#pragma once

#include <optional>
#include <string>
#include <utility>

namespace locind {

class Status {
 public:
  Status() = default;  // ok
  static Status Ok() { return Status(); }
  static Status Error(std::string message) { return Status(std::move(message)); }

  bool ok() const { return !message_.has_value(); }
  // REQUIRES: !ok().
  const std::string& message() const { return *message_; }

 private:
  explicit Status(std::string message) : message_(std::move(message)) {}
  std::optional<std::string> message_;
};

template <typename T>
class Result {
 public:
  Result(T value) : value_(std::move(value)) {}         // NOLINT: implicit by design
  Result(Status status) : status_(std::move(status)) {}  // NOLINT: REQUIRES !status.ok()

  bool ok() const { return value_.has_value(); }
  const Status& status() const { return status_; }
  // REQUIRES: ok().
  const T& value() const& { return *value_; }
  T& value() & { return *value_; }
  T&& value() && { return std::move(*value_); }
  const T& operator*() const { return *value_; }
  const T* operator->() const { return &*value_; }

 private:
  std::optional<T> value_;
  Status status_;
};

}  // namespace locind
