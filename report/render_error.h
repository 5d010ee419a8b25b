// The one error type of ferrum_report. libharu error codes are converted to
// it at the edge (the handler installed by PdfDocument), with the code in hex
// and libharu's detail number in the message.
#pragma once

#include <stdexcept>
#include <string>

namespace ferrum::report {

class RenderError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

}  // namespace ferrum::report
