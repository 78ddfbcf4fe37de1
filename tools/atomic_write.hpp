// tools/atomic_write.hpp - the one file writer every verb uses.
//
// The content goes to a temporary file in the target's directory, is flushed to
// disk (fsync), and only then renamed over the target. On any failure the
// temporary file is removed and the target is left as it was: a failed run never
// leaves a half-written file and never replaces a good file with a bad one.
//
// The target must be a regular file or a new name. A symbolic link is followed
// (the temporary file goes beside the file it leads to and is renamed over that
// file, so the link stays a link); a directory, device, FIFO or socket is
// refused with input_error (exit 2) and left untouched.
#ifndef COUNTERFLUX_TOOLS_ATOMIC_WRITE_HPP
#define COUNTERFLUX_TOOLS_ATOMIC_WRITE_HPP

#include <filesystem>
#include <functional>
#include <iosfwd>
#include <string_view>

namespace counterflux::tool {

/// Writes content to target atomically. Throws input_error for an empty path
/// or a target that is not a regular file (see above), run_error for any other
/// failure. Messages name target as given and, when a symbolic link led
/// elsewhere, the file it leads to in parentheses.
void atomic_write(const std::filesystem::path& target, std::string_view content);

/// Streams what producer writes to target atomically. If producer throws, or a
/// write fails, the temporary file is removed, the target is untouched and the
/// exception propagates (write failures as run_error).
void atomic_write(const std::filesystem::path& target,
                  const std::function<void(std::ostream&)>& producer);

/// True when name looks like one of atomic_write's temporary files
/// (".<target name>.tmp-XXXXXX"); tests use it to prove none is left behind.
bool is_atomic_write_temporary(std::string_view name) noexcept;

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_ATOMIC_WRITE_HPP
