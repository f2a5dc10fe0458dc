// The scratch folder of the fuzz harnesses: every input is written there as a file, and the files
// a case may name (meshes, tables) are copies inside it, so no input makes a harness read any
// other file of the machine.
#pragma once

#include <cstddef>
#include <cstdint>
#include <string>

namespace fickcast::fuzz
{
  /**
   * The scratch folder, created on first use under $TMPDIR (or /tmp) and removed at exit. It holds
   * ROOT/case/ (where the case harness writes case.ini) with copies of tests/bad_input/meshes
   * and tests/bad_input/tables, plus the fuzz tables, in ROOT/case/meshes and ROOT/case/tables,
   * and the demo meshes in ROOT/meshes (as `../meshes/NAME.msh` in cases/ expects).
   */
  const std::string &scratch_folder();

  /// Writes the @p size bytes at @p data to ROOT/@p name (replacing it) and returns its path.
  std::string write_input(const std::string &name, const uint8_t *data, std::size_t size);

  /// Whether @p path, resolved against @p folder as the case reader resolves it (absolute as is,
  /// relative to the folder otherwise), stays inside the scratch folder.
  bool inside_scratch(const std::string &folder, const std::string &path);

  /// Prints @p what (an outcome that is neither a result nor an InputError) and aborts, so
  /// libFuzzer keeps the input and the replay test fails.
  [[noreturn]] void finding(const std::string &what);
} // namespace fickcast::fuzz
