// The one atomic file writer: a failure at any point leaves the target as it
// was and no temporary file behind.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>

#include <sys/stat.h>
#include <unistd.h>

#include "atomic_write.hpp"
#include "errors.hpp"

namespace fs = std::filesystem;
using counterflux::tool::atomic_write;
using counterflux::tool::input_error;
using counterflux::tool::run_error;

namespace {

// A fresh scratch directory for one test case, removed afterwards.
struct scratch {
    fs::path dir;
    explicit scratch(const std::string& name) {
        dir = fs::temp_directory_path() / ("counterflux_atomic_" + name + "_" + std::to_string(::getpid()));
        fs::remove_all(dir);
        fs::create_directories(dir);
    }
    ~scratch() {
        std::error_code ec;
        fs::remove_all(dir, ec);
    }
    std::size_t temporaries() const {
        std::size_t n = 0;
        for (const auto& e : fs::directory_iterator(dir))
            if (counterflux::tool::is_atomic_write_temporary(e.path().filename().string())) ++n;
        return n;
    }
};

std::string read(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

void write_plain(const fs::path& p, const std::string& text) {
    std::ofstream out(p, std::ios::binary);
    out << text;
}

}  // namespace

TEST_CASE("atomic write: creates and replaces a file") {
    scratch s("replace");
    const fs::path target = s.dir / "report.json";
    atomic_write(target, std::string("first\n"));
    CHECK(read(target) == "first\n");
    atomic_write(target, std::string("second, longer\n"));
    CHECK(read(target) == "second, longer\n");
    atomic_write(target, std::string(""));
    CHECK(read(target).empty());
    CHECK(s.temporaries() == 0);
}

TEST_CASE("atomic write: a producer that fails midway leaves the old file and no temporary") {
    scratch s("producer");
    const fs::path target = s.dir / "table.bin";
    write_plain(target, "good old content");
    // More than the writer's buffer, so part of it has reached the temporary file.
    const std::string chunk(200000, 'x');
    CHECK_THROWS_AS(atomic_write(target,
                                 [&](std::ostream& out) {
                                     out << chunk;
                                     throw std::runtime_error("generator failed");
                                 }),
                    std::runtime_error);
    CHECK(read(target) == "good old content");
    CHECK(s.temporaries() == 0);
}

TEST_CASE("atomic write: streaming output arrives whole") {
    scratch s("stream");
    const fs::path target = s.dir / "big.csv";
    atomic_write(target, [](std::ostream& out) {
        for (int i = 0; i < 100000; ++i) out << i << '\n';
    });
    const std::string text = read(target);
    CHECK(text.substr(0, 4) == "0\n1\n");
    CHECK(text.substr(text.size() - 6) == "99999\n");
    CHECK(s.temporaries() == 0);
}

TEST_CASE("atomic write: a target that is a directory is refused as bad input and left alone") {
    scratch s("directory");
    const fs::path target = s.dir / "out";
    fs::create_directories(target);
    write_plain(target / "keep.txt", "keep");
    CHECK_THROWS_AS(atomic_write(target, std::string("x")), input_error);
    CHECK_THROWS_AS(atomic_write(s.dir / "out" / "", std::string("x")), input_error);
    CHECK(fs::is_directory(target));
    CHECK(read(target / "keep.txt") == "keep");
    CHECK(s.temporaries() == 0);
}

TEST_CASE("atomic write: a FIFO is refused as bad input and stays a FIFO") {
    scratch s("fifo");
    const fs::path target = s.dir / "pipe";
    REQUIRE(::mkfifo(target.c_str(), 0600) == 0);
    try {
        atomic_write(target, std::string("x"));
        FAIL("no error");
    } catch (const input_error& e) {
        const std::string message = e.what();
        CHECK(message.find("is a FIFO") != std::string::npos);
        CHECK(message.find(target.string()) != std::string::npos);
    }
    CHECK(fs::is_fifo(fs::symlink_status(target)));
    CHECK(s.temporaries() == 0);

    // Through a symbolic link, too: the FIFO it leads to is not replaced.
    const fs::path link = s.dir / "pipe_link";
    fs::create_symlink("pipe", link);
    CHECK_THROWS_AS(atomic_write(link, std::string("x")), input_error);
    CHECK(fs::is_symlink(fs::symlink_status(link)));
    CHECK(fs::is_fifo(fs::symlink_status(target)));
    CHECK(s.temporaries() == 0);
}

TEST_CASE("atomic write: a symbolic link is written through and stays a link") {
    scratch s("symlink");
    fs::create_directories(s.dir / "real");
    const fs::path file = s.dir / "real" / "table.h";
    write_plain(file, "old");
    ::chmod(file.c_str(), 0640);
    const fs::path link = s.dir / "table.h";
    fs::create_symlink(fs::path("real") / "table.h", link);  // relative, resolved beside the link

    atomic_write(link, std::string("new content"));
    CHECK(fs::is_symlink(fs::symlink_status(link)));
    CHECK(fs::read_symlink(link) == fs::path("real") / "table.h");
    CHECK(read(file) == "new content");
    struct stat st {};
    REQUIRE(::stat(file.c_str(), &st) == 0);
    CHECK((st.st_mode & 0777) == 0640);
    CHECK(s.temporaries() == 0);
    std::size_t beside = 0;  // the temporary went beside the resolved file, and is gone
    for (const auto& e : fs::directory_iterator(s.dir / "real"))
        if (counterflux::tool::is_atomic_write_temporary(e.path().filename().string())) ++beside;
    CHECK(beside == 0);

    // A chain of two links, the second absolute.
    const fs::path second = s.dir / "second";
    fs::create_symlink(fs::absolute(file), second);
    const fs::path first = s.dir / "first";
    fs::create_symlink("second", first);
    atomic_write(first, std::string("via two links"));
    CHECK(fs::is_symlink(fs::symlink_status(first)));
    CHECK(fs::is_symlink(fs::symlink_status(second)));
    CHECK(read(file) == "via two links");

    // A dangling link creates the file it names.
    const fs::path dangling = s.dir / "dangling";
    fs::create_symlink(fs::path("real") / "new.csv", dangling);
    atomic_write(dangling, std::string("fresh"));
    CHECK(fs::is_symlink(fs::symlink_status(dangling)));
    CHECK(read(s.dir / "real" / "new.csv") == "fresh");

    // A link to a directory is refused; the link and the directory stay.
    const fs::path to_dir = s.dir / "to_dir";
    fs::create_symlink("real", to_dir);
    CHECK_THROWS_AS(atomic_write(to_dir, std::string("x")), input_error);
    CHECK(fs::is_symlink(fs::symlink_status(to_dir)));
    CHECK(fs::is_directory(s.dir / "real"));

    // A loop of links is an error, not a hang.
    fs::create_symlink("loop_b", s.dir / "loop_a");
    fs::create_symlink("loop_a", s.dir / "loop_b");
    CHECK_THROWS_AS(atomic_write(s.dir / "loop_a", std::string("x")), run_error);
    CHECK(s.temporaries() == 0);
}

TEST_CASE("atomic write: a missing directory is an error, not a crash") {
    scratch s("missing");
    CHECK_THROWS_AS(atomic_write(s.dir / "no" / "such" / "dir" / "f.txt", std::string("x")), run_error);
    try {
        atomic_write(s.dir / "no" / "f.txt", std::string("x"));
    } catch (const run_error& e) {
        CHECK(std::string(e.what()).find("cannot write") != std::string::npos);
    }
}

TEST_CASE("atomic write: an empty path is bad input") {
    try {
        atomic_write(fs::path(), std::string("x"));
        FAIL("no exception");
    } catch (const input_error& e) {
        CHECK(std::string(e.what()) ==
              "counterflux: error: cannot write: the output path is empty; expected a file name");
    }
}

TEST_CASE("atomic write: a failure through a symbolic link names the link, then where it leads") {
    scratch s("dangling_missing");
    // A dangling link into a directory that does not exist.
    const fs::path link = s.dir / "out.json";
    fs::create_symlink(fs::path("no_such_dir") / "real.json", link);
    try {
        atomic_write(link, std::string("x"));
        FAIL("no exception");
    } catch (const run_error& e) {
        const std::string m = e.what();
        CAPTURE(m);
        CHECK(m.rfind("cannot write '" + link.string() + "' (which leads to '" +
                          (s.dir / "no_such_dir" / "real.json").string() + "'): cannot create a temporary file",
                      0) == 0);
    }
    CHECK(fs::is_symlink(fs::symlink_status(link)));
    // Without a link, the path is named once.
    try {
        atomic_write(s.dir / "no_such_dir" / "f.json", std::string("x"));
        FAIL("no exception");
    } catch (const run_error& e) {
        CHECK(std::string(e.what()).find("which leads to") == std::string::npos);
    }
}

TEST_CASE("atomic write: an existing file keeps its permissions") {
    scratch s("mode");
    const fs::path target = s.dir / "f.h";
    write_plain(target, "old");
    ::chmod(target.c_str(), 0640);
    atomic_write(target, std::string("new"));
    struct stat st {};
    REQUIRE(::stat(target.c_str(), &st) == 0);
    CHECK((st.st_mode & 0777) == 0640);
    CHECK(read(target) == "new");
}

TEST_CASE("atomic write: a relative name writes in the current directory") {
    scratch s("relative");
    const fs::path old = fs::current_path();
    fs::current_path(s.dir);
    atomic_write("plain.txt", std::string("here"));
    fs::current_path(old);
    CHECK(read(s.dir / "plain.txt") == "here");
    CHECK(s.temporaries() == 0);
}
