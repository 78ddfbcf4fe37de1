// tools/atomic_write.cpp - see atomic_write.hpp (POSIX implementation).
#include "atomic_write.hpp"

#include <cerrno>
#include <cstring>
#include <ostream>
#include <streambuf>
#include <string>
#include <vector>

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include "errors.hpp"

namespace counterflux::tool {

namespace {

constexpr std::string_view temp_marker = ".tmp-";

std::string system_message(int error_number) { return std::strerror(error_number); }

// How messages name the output: the path the user gave, and the file a
// symbolic link led to when that differs ("'out.json' (which leads to 'real/out.json')").
std::string output_name(const std::filesystem::path& requested, const std::filesystem::path& target) {
    std::string name = "'" + requested.string() + "'";
    if (target != requested) name += " (which leads to '" + target.string() + "')";
    return name;
}

[[noreturn]] void fail(const std::string& name, const std::string& what, int error_number) {
    throw run_error("cannot write " + name + ": " + what + ": " + system_message(error_number));
}

[[noreturn]] void fail(const std::filesystem::path& target, const std::string& what, int error_number) {
    fail(output_name(target, target), what, error_number);
}

// A stream buffer over a file descriptor that throws on a failed write.
class fd_buffer : public std::streambuf {
public:
    fd_buffer(int fd, const std::string& name) : fd_(fd), name_(name), buffer_(1 << 16) {
        setp(buffer_.data(), buffer_.data() + buffer_.size());
    }

    void flush_all() {
        const char* p = pbase();
        std::size_t left = static_cast<std::size_t>(pptr() - pbase());
        while (left > 0) {
            const ssize_t n = ::write(fd_, p, left);
            if (n < 0) {
                if (errno == EINTR) continue;
                fail(name_, "write failed", errno);
            }
            p += n;
            left -= static_cast<std::size_t>(n);
        }
        setp(buffer_.data(), buffer_.data() + buffer_.size());
    }

protected:
    int_type overflow(int_type ch) override {
        flush_all();
        if (!traits_type::eq_int_type(ch, traits_type::eof())) {
            *pptr() = traits_type::to_char_type(ch);
            pbump(1);
        }
        return traits_type::not_eof(ch);
    }

    int sync() override {
        flush_all();
        return 0;
    }

private:
    int fd_;
    const std::string& name_;
    std::vector<char> buffer_;
};

// Removes the temporary file unless released.
struct temp_guard {
    std::string path;
    int fd = -1;
    bool armed = true;
    ~temp_guard() {
        if (fd >= 0) ::close(fd);
        if (armed && !path.empty()) ::unlink(path.c_str());
    }
};

mode_t new_file_mode(const std::filesystem::path& target) {
    struct stat st {};
    if (::stat(target.c_str(), &st) == 0 && S_ISREG(st.st_mode)) return st.st_mode & 07777;
    const mode_t mask = ::umask(0);
    ::umask(mask);
    return static_cast<mode_t>(0666 & ~mask);
}

void fsync_directory(const std::filesystem::path& dir) {
    const int fd = ::open(dir.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
    if (fd < 0) return;  // best effort: the rename itself already happened
    (void)::fsync(fd);
    ::close(fd);
}

// The file the write must replace: target itself, or, when target is a
// symbolic link, the file the chain of links ends at (which may not exist
// yet: a dangling link is written through, as a shell redirection would).
// Refuses, as bad input, a target that is not a regular file: renaming over a
// directory, a device, a FIFO or a socket would destroy it.
std::filesystem::path resolve_target(const std::filesystem::path& target) {
    std::filesystem::path path = target;
    for (int links = 0;; ++links) {
        struct stat st {};
        if (::lstat(path.c_str(), &st) != 0) {
            if (errno == ENOENT) return path;  // a new file
            fail(target, "cannot examine '" + path.string() + "'", errno);
        }
        if (S_ISREG(st.st_mode)) return path;
        if (S_ISLNK(st.st_mode)) {
            if (links >= 40) fail(target, "too many levels of symbolic links", ELOOP);
            std::error_code ec;
            const std::filesystem::path link = std::filesystem::read_symlink(path, ec);
            if (ec) fail(target, "cannot read the symbolic link '" + path.string() + "'", ec.value());
            path = link.is_absolute() ? link : path.parent_path() / link;
            continue;
        }
        const char* what = S_ISDIR(st.st_mode)    ? "a directory"
                           : S_ISFIFO(st.st_mode) ? "a FIFO"
                           : S_ISSOCK(st.st_mode) ? "a socket"
                           : S_ISCHR(st.st_mode)  ? "a character device"
                           : S_ISBLK(st.st_mode)  ? "a block device"
                                                  : "not a regular file";
        std::string message = "cannot write '" + target.string() + "': ";
        if (path != target) message += "it leads to '" + path.string() + "', which ";
        else message += "it ";
        message += std::string("is ") + what + "; expected a regular file or a new file name (it was left alone)";
        throw input_error(source_place{}, message);
    }
}

}  // namespace

bool is_atomic_write_temporary(std::string_view name) noexcept {
    return name.size() > 1 && name.front() == '.' && name.find(temp_marker) != std::string_view::npos;
}

void atomic_write(const std::filesystem::path& requested, const std::function<void(std::ostream&)>& producer) {
    if (requested.empty())
        throw input_error(source_place{}, "cannot write: the output path is empty; expected a file name");
    if (requested.filename().empty() || requested.filename() == "." || requested.filename() == "..")
        throw input_error(source_place{}, "cannot write '" + requested.string() +
                                              "': it names a directory; expected a file name");
    // Written beside, and renamed over, the file a symbolic link leads to.
    const std::filesystem::path target = resolve_target(requested);
    const std::string name = output_name(requested, target);

    const std::filesystem::path dir = target.has_parent_path() ? target.parent_path() : ".";
    std::string pattern = (dir / ("." + target.filename().string() + std::string(temp_marker) + "XXXXXX")).string();

    temp_guard guard;
    std::vector<char> temp_name(pattern.begin(), pattern.end());
    temp_name.push_back('\0');
    guard.fd = ::mkstemp(temp_name.data());
    if (guard.fd < 0) fail(name, "cannot create a temporary file in '" + dir.string() + "'", errno);
    guard.path = temp_name.data();

    {
        fd_buffer buffer(guard.fd, name);
        std::ostream out(&buffer);
        out.exceptions(std::ios::badbit);
        try {
            producer(out);
            out.flush();
        } catch (const std::ios_base::failure&) {
            // The buffer threw run_error inside a stream operation; the stream
            // turned it into badbit and rethrew as ios failure on some paths.
            fail(name, "write failed", errno != 0 ? errno : EIO);
        }
        buffer.flush_all();
    }

    if (::fchmod(guard.fd, new_file_mode(target)) != 0) fail(name, "cannot set permissions", errno);
    if (::fsync(guard.fd) != 0) fail(name, "fsync failed", errno);
    const int fd = guard.fd;
    guard.fd = -1;
    if (::close(fd) != 0) fail(name, "close failed", errno);
    if (::rename(guard.path.c_str(), target.c_str()) != 0) fail(name, "rename failed", errno);
    guard.armed = false;
    fsync_directory(dir);
}

void atomic_write(const std::filesystem::path& target, std::string_view content) {
    atomic_write(target, [content](std::ostream& out) { out.write(content.data(), static_cast<std::streamsize>(content.size())); });
}

}  // namespace counterflux::tool
