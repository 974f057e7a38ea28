// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

namespace Periodic.Cli.Output;

/// <summary>Writes files so that a reader never sees a half-written one.</summary>
internal static class OutputFile
{
    /// <summary>
    /// Writes to a temporary file beside <paramref name="path"/> and then renames it over the target
    /// (a rename within one directory is atomic on POSIX file systems and NTFS). If anything fails the
    /// temporary file is removed and the target is left as it was.
    /// </summary>
    public static void WriteAtomically(string path, Action<Stream> write)
    {
        var full = Path.GetFullPath(path);
        var directory = Path.GetDirectoryName(full)!;
        if (!Directory.Exists(directory))
        {
            throw new UsageException($"cannot write {path}: the directory {directory} does not exist.");
        }
        var temporary = Path.Combine(directory, "." + Path.GetFileName(full) + "." + Guid.NewGuid().ToString("N")[..8] + ".tmp");
        try
        {
            using (var stream = new FileStream(temporary, FileMode.CreateNew, FileAccess.Write))
            {
                write(stream);
                stream.Flush(flushToDisk: true);
            }
            File.Move(temporary, full, overwrite: true);
        }
        catch
        {
            File.Delete(temporary);
            throw;
        }
    }

    public static void WriteText(string path, string text) =>
        WriteAtomically(path, stream =>
        {
            var bytes = new System.Text.UTF8Encoding(false).GetBytes(text);
            stream.Write(bytes);
        });
}
