#pragma once
// The typed error of the fleet store: what failed, on which database, with SQLite's own code.

#include <string>

namespace humwise::storage {

struct StorageError {
    enum class Code {
        CannotOpen,      // missing folder, no permission, not a database
        ReadOnly,        // the file or folder does not allow writing
        Busy,            // locked by another process beyond the busy timeout
        Corrupt,         // integrity problem ("database disk image is malformed")
        Full,            // disk or quota full
        TooNew,          // written by a newer Humwise (schema version above ours)
        Constraint,      // a foreign key, unique or check constraint refused the change
        NotFound,        // a motor, point, round ... that does not exist
        Invalid,         // the caller asked for something impossible (bad argument)
        Io,              // other I/O errors
        Internal,        // anything else SQLite reported
    };
    Code code = Code::Internal;
    std::string message; // "DB: what failed: SQLite's words"
    int sqliteCode = 0;
};

const char* codeName(StorageError::Code code);

// SQLite's result code (primary or extended) as ours.
StorageError::Code codeForSqlite(int resultCode);

// What the user can do about an error, from SQLite's result code (primary or extended) and its
// code here; appended to its message ("" when nothing useful can be said).
const char* adviceFor(int resultCode, StorageError::Code code);

// Thrown by the low-level wrappers; repositories catch it at their boundary and return it as a
// value in Result<T, StorageError>.
struct StorageException {
    StorageError error;
};

} // namespace humwise::storage
