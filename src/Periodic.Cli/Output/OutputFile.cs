// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Collections.Concurrent;
using System.Runtime.InteropServices;

namespace Periodic.Cli.Output;

/// <summary>
/// Writes the tool's output files (<c>--out</c>) so that nothing but the named file changes and a reader never
/// sees a half-written one.
/// </summary>
/// <remarks>
/// <list type="bullet">
/// <item>A regular file (or a path that does not exist yet) is written to a temporary file beside it, flushed to
/// disk and renamed over the target: a rename within one directory is atomic on POSIX file systems and NTFS. The
/// replaced file keeps its permission bits.</item>
/// <item>A symbolic link is followed: the file it points to is replaced and the link stays a link.</item>
/// <item>A device, FIFO or socket is never replaced: the output is written into it as a stream (as root, a rename
/// over <c>/dev/null</c> would otherwise replace the device node).</item>
/// <item>Refused with a <see cref="UsageException"/> (exit 2) naming <c>--out</c>: an empty path, a directory, a
/// missing directory, a read-only file, and any file this process read as input.</item>
/// <item>Temporary files are removed when writing fails and when the process receives SIGINT or SIGTERM; only
/// SIGKILL or a power cut can leave one behind (named <c>.NAME.XXXXXXXX.tmp</c>, beside the target).</item>
/// </list>
/// </remarks>
internal static class OutputFile
{
    /// <summary>The option through which every command names its output file.</summary>
    public const string Option = "--out";

    private static readonly ConcurrentDictionary<string, byte> PendingTemporaries = new(StringComparer.Ordinal);
    private static readonly ConcurrentDictionary<string, FileIdentity> Inputs = new(StringComparer.Ordinal);
    private static readonly PosixSignalRegistration?[] SignalCleanup = RegisterSignalCleanup();

    /// <summary>Records a file this process reads, so that <c>--out</c> can never overwrite it.</summary>
    public static void RegisterInput(string path)
    {
        var full = Path.GetFullPath(path);
        var resolved = FinalTarget(full);
        Inputs[resolved] = FileIdentity.Of(resolved);
    }

    /// <summary>Writes <paramref name="write"/>'s bytes to <paramref name="path"/> under the rules above.</summary>
    /// <param name="path">The output file.</param>
    /// <param name="write">Writes the bytes.</param>
    /// <param name="option">The option that named the file, for messages (<c>--out</c> unless a command has other outputs, e.g. <c>--plot</c>).</param>
    public static void WriteAtomically(string path, Action<Stream> write, string option = Option)
    {
        var target = Check(path, option);
        if (target.Kind == FileKind.Stream)
        {
            WriteStream(path, target.Path, write, option);
        }
        else
        {
            Replace(path, target.Path, write, option);
        }
    }

    /// <summary>
    /// Refuses <paramref name="path"/> as <see cref="WriteAtomically"/> would (empty, a directory, a missing directory, a
    /// read-only file, an input of this command), before a command creates anything beside it (a sweep's journal).
    /// </summary>
    /// <param name="path">The output file.</param>
    /// <param name="option">The option that named the file, for messages.</param>
    public static void Validate(string path, string option = Option) => Check(path, option);

    /// <summary>Writes UTF-8 text (no byte-order mark) under the rules of <see cref="WriteAtomically"/>.</summary>
    /// <param name="path">The output file.</param>
    /// <param name="text">The text.</param>
    /// <param name="option">The option that named the file, for messages.</param>
    public static void WriteText(string path, string text, string option = Option) =>
        WriteAtomically(path, stream =>
        {
            var bytes = new System.Text.UTF8Encoding(false).GetBytes(text);
            stream.Write(bytes);
        }, option);

    /// <summary>
    /// Removes the temporary files a killed writer of <paramref name="path"/> left beside it (<c>.NAME.XXXXXXXX.tmp</c>): for a
    /// command that resumes after SIGKILL (a sweep streams its rows into the temporary file while it computes).
    /// </summary>
    public static void RemoveStaleTemporaries(string path)
    {
        var target = FinalTarget(Path.GetFullPath(path));
        var directory = Path.GetDirectoryName(target)!;
        if (!Directory.Exists(directory))
        {
            return;
        }
        var prefix = "." + Path.GetFileName(target) + ".";
        foreach (var file in Directory.EnumerateFiles(directory, prefix + "*.tmp"))
        {
            var middle = Path.GetFileName(file)[prefix.Length..^".tmp".Length];
            if (middle.Length == 8 && middle.All(char.IsAsciiHexDigitLower) && !PendingTemporaries.ContainsKey(file))
            {
                TryDelete(file);
            }
        }
    }

    /// <summary>Where the bytes go and how, or a refusal that names the option and the path.</summary>
    private static (string Path, FileKind Kind) Check(string path, string option)
    {
        if (string.IsNullOrWhiteSpace(path))
        {
            throw new UsageException($"{option} needs a file path; got an empty one.");
        }
        var full = Path.GetFullPath(path);
        var target = FinalTarget(full, option);
        var identity = FileIdentity.Of(target);
        if (identity.Kind == FileKind.Directory)
        {
            throw new UsageException($"{option} {Printable.Quote(path)} is a directory; give a file path.");
        }
        var directory = Path.GetDirectoryName(target)!;
        if (!Directory.Exists(directory))
        {
            throw new UsageException($"{option} {Printable.Quote(path)}: the directory {Printable.Quote(directory)} does not exist.");
        }
        foreach (var (inputPath, input) in Inputs)
        {
            if (string.Equals(inputPath, target, StringComparison.Ordinal) || identity.SameFileAs(input))
            {
                throw new UsageException($"{option} {Printable.Quote(path)} is an input file of this command; choose another output path.");
            }
        }
        if (identity.Kind == FileKind.Regular && new FileInfo(target).IsReadOnly)
        {
            throw new UsageException($"{option} {Printable.Quote(path)} is read-only; make it writable or choose another path (the tool does not replace read-only files).");
        }
        return (target, identity.Kind == FileKind.Missing ? FileKind.Regular : identity.Kind);
    }

    private static void Replace(string given, string target, Action<Stream> write, string option)
    {
        var directory = Path.GetDirectoryName(target)!;
        var temporary = Path.Combine(directory, "." + Path.GetFileName(target) + "." + Guid.NewGuid().ToString("N")[..8] + ".tmp");
        UnixFileMode? mode = OperatingSystem.IsWindows() || !File.Exists(target) ? null : File.GetUnixFileMode(target);
        PendingTemporaries[temporary] = 0;
        try
        {
            using (var stream = new FileStream(temporary, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                write(stream);
                stream.Flush(flushToDisk: true);
            }
            if (mode is { } keep && !OperatingSystem.IsWindows())
            {
                File.SetUnixFileMode(temporary, keep);
            }
            File.Move(temporary, target, overwrite: true);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw Failure(given, temporary, e, option);
        }
        finally
        {
            TryDelete(temporary);
            PendingTemporaries.TryRemove(temporary, out _);
        }
    }

    private static void WriteStream(string given, string target, Action<Stream> write, string option)
    {
        try
        {
            // FileMode.Open: a device or FIFO is written into, never truncated, created or replaced.
            using var stream = new FileStream(target, FileMode.Open, FileAccess.Write, FileShare.ReadWrite);
            write(stream);
            stream.Flush();
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw Failure(given, target, e, option);
        }
    }

    /// <summary>An I/O failure that names the target the user gave, never the temporary file.</summary>
    private static Exception Failure(string given, string inner, Exception e, string option)
    {
        var reason = e.Message.Replace(inner, given, StringComparison.Ordinal);
        var message = $"cannot write {option} {Printable.Quote(given)}: {reason}";
        return e is UnauthorizedAccessException or DirectoryNotFoundException
            ? new UsageException(message)
            : new IOException(message, e);
    }

    /// <summary>The file a path finally names: symbolic links are followed (also dangling ones, whose target is created).</summary>
    private static string FinalTarget(string full, string option = Option)
    {
        try
        {
            var info = new FileInfo(full);
            if (info.LinkTarget is null)
            {
                return full;
            }
            var final = File.ResolveLinkTarget(full, returnFinalTarget: true);
            return final is null ? full : Path.GetFullPath(final.FullName);
        }
        catch (IOException e)
        {
            throw new UsageException($"{option} {Printable.Quote(full)}: {e.Message}");
        }
    }

    private static void TryDelete(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (IOException)
        {
            // Best effort: the original error is the one to report.
        }
        catch (UnauthorizedAccessException)
        {
        }
    }

    private static PosixSignalRegistration?[] RegisterSignalCleanup()
    {
        if (OperatingSystem.IsWindows() || OperatingSystem.IsBrowser())
        {
            return [];
        }
        // The handler does not cancel the signal, so the default action (termination) follows the clean-up.
        static void Clean(PosixSignalContext _)
        {
            foreach (var temporary in PendingTemporaries.Keys)
            {
                TryDelete(temporary);
            }
        }
        return [PosixSignalRegistration.Create(PosixSignal.SIGINT, Clean), PosixSignalRegistration.Create(PosixSignal.SIGTERM, Clean)];
    }

    private enum FileKind
    {
        Missing,
        Regular,
        Directory,
        Stream,
    }

    /// <summary>What a path is (after following links) and, where the system says, its device and inode.</summary>
    private readonly record struct FileIdentity(FileKind Kind, ulong Device, ulong Inode, bool HasInode)
    {
        public bool SameFileAs(FileIdentity other) =>
            HasInode && other.HasInode && Device == other.Device && Inode == other.Inode;

        public static FileIdentity Of(string path)
        {
            if (Directory.Exists(path))
            {
                return new(FileKind.Directory, 0, 0, false);
            }
            if (!File.Exists(path))
            {
                return new(FileKind.Missing, 0, 0, false);
            }
            if (OperatingSystem.IsLinux() && LinuxStat.TryStat(path, out var mode, out var device, out var inode))
            {
                const int TypeMask = 0xF000, RegularFile = 0x8000;
                return new((mode & TypeMask) == RegularFile ? FileKind.Regular : FileKind.Stream, device, inode, true);
            }
            // Elsewhere .NET does not say whether a file is a device: treat the device folder as devices.
            return new(path.StartsWith("/dev/", StringComparison.Ordinal) ? FileKind.Stream : FileKind.Regular, 0, 0, false);
        }
    }

    /// <summary>
    /// statx(2) from the C library: .NET reports devices and FIFOs as ordinary files, so the file type comes from
    /// the system. statx's layout is the same on every Linux architecture (mode at byte 28, inode at 32, device
    /// major/minor at 136/140), unlike struct stat's.
    /// </summary>
    private static class LinuxStat
    {
        private const int AtCurrentDirectory = -100;
        private const uint TypeAndInode = 0x1 | 0x100; // STATX_TYPE | STATX_INO

        public static bool TryStat(string path, out int mode, out ulong device, out ulong inode)
        {
            mode = 0;
            device = inode = 0;
            Span<byte> buffer = stackalloc byte[256];
            try
            {
                if (Statx(AtCurrentDirectory, path, 0, TypeAndInode, ref MemoryMarshal.GetReference(buffer)) != 0)
                {
                    return false;
                }
            }
            catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException)
            {
                return false; // a C library without statx (glibc before 2.28): fall back to the portable rule
            }
            mode = BitConverter.ToUInt16(buffer[28..]);
            inode = BitConverter.ToUInt64(buffer[32..]);
            device = ((ulong)BitConverter.ToUInt32(buffer[136..]) << 32) | BitConverter.ToUInt32(buffer[140..]);
            return true;
        }

        // Runtime marshalling (DllImport) rather than the LibraryImport generator, which needs unsafe code enabled.
        [DllImport("libc.so.6", EntryPoint = "statx", ExactSpelling = true)]
        private static extern int Statx(int directory, [MarshalAs(UnmanagedType.LPUTF8Str)] string path, int flags, uint mask, ref byte buffer);
    }
}
