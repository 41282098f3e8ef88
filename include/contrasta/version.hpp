#pragma once
namespace contrasta {
// The library version, "MAJOR.MINOR.PATCH".
const char* version();
}  // namespace contrasta
