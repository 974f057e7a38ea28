// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Text;
using System.Text.RegularExpressions;
using Periodic.Serialization;
using Xunit.Abstractions;

namespace Periodic.Tests.Serialization;

/// <summary>
/// Fuzz corpus of the structure-file reader: the example files mutated at random (fixed seed, so a failure replays) by
/// byte flips, deletions, duplications and splices of hostile tokens (huge, tiny and negative numbers, lone surrogates,
/// control characters, invalid UTF-8, deep nesting, wrong kinds). Every case must either load or fail with a
/// <see cref="StructureFileException"/> whose message is one line that starts with the source, line and column —
/// never another exception, a crash or a hang.
/// </summary>
public sealed partial class StructureFileFuzzTest(ITestOutputHelper output)
{
    /// <summary>Mutated documents per run.</summary>
    private const int Cases = 20_000;

    private static readonly string[] Hostile =
    [
        "1e308", "-1e308", "1e-300", "-0", "0", "1e400", "NaN", "\"\\ud800\"", "\"\\udc00x\"", "\"\\u001b[2J\"", "null", "true", "[]", "{}",
        "\"5 nm\"", "\"1e300 meV\"", "\"-3 m0\"", "\"0.1 eV nm\"", "[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[1]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]",
        "{\"fourier\":{\"period\":4,\"cosine\":[0.2],\"mass\":0.067}}", "{\"profile\":{\"positions\":[0,1,1],\"potentials\":[0,0,0],\"mass\":0.067}}",
        "{\"delta\":1e308}", "\"stack\":{\"periods\":1e9}", "\"stack\":{\"periods\":3}", "2147483648", "\"\"", "\"\\u0000\"",
    ];

    [GeneratedRegex(@"^[^\n]+:\d+:\d+: ", RegexOptions.CultureInvariant)]
    private static partial Regex Located();

    [Fact]
    public void Parse_MutatedExamples_LoadOrFailWithOneLocatedLine()
    {
        var seeds = Directory.GetFiles(Repository.ExampleStructures, "*.json")
            .Order(StringComparer.Ordinal).Select(File.ReadAllBytes).ToArray();
        var hostile = Hostile.Select(Encoding.UTF8.GetBytes).ToArray();
        var random = new Random(20261203);
        int loaded = 0, refused = 0;
        for (var i = 0; i < Cases; i++)
        {
            var bytes = new List<byte>(seeds[random.Next(seeds.Length)]);
            var mutations = 1 + random.Next(4);
            for (var m = 0; m < mutations && bytes.Count > 0; m++)
            {
                var at = random.Next(bytes.Count);
                switch (random.Next(6))
                {
                    case 0: // flip a byte (invalid UTF-8, control characters, broken syntax)
                        bytes[at] = (byte)random.Next(256);
                        break;
                    case 1: // delete a run
                        bytes.RemoveRange(at, Math.Min(bytes.Count - at, 1 + random.Next(16)));
                        break;
                    case 2: // duplicate a run
                        bytes.InsertRange(at, bytes.GetRange(at, Math.Min(bytes.Count - at, 1 + random.Next(32))));
                        break;
                    default: // replace the value after a colon, or splice at random, with a hostile token
                        var colon = bytes.IndexOf((byte)':', at);
                        var start = colon >= 0 ? colon + 1 : at;
                        var end = start;
                        while (end < bytes.Count && bytes[end] is not ((byte)',' or (byte)'}' or (byte)']'))
                        {
                            end++;
                        }
                        bytes.RemoveRange(start, random.Next(2) == 0 ? end - start : 0);
                        bytes.InsertRange(start, hostile[random.Next(hostile.Length)]);
                        break;
                }
            }
            var document = bytes.ToArray();
            try
            {
                StructureFile.Parse(document, "fuzz.json");
                loaded++;
            }
            catch (StructureFileException e)
            {
                refused++;
                Assert.True(!e.Message.Contains('\n', StringComparison.Ordinal) && Located().IsMatch(e.Message),
                    $"case {i}: message not one located line: {e.Message}");
            }
            catch (Exception e)
            {
                Assert.Fail($"case {i}: {e.GetType().Name}: {e.Message}\ndocument: {Encoding.UTF8.GetString(document)}");
            }
        }
        Assert.Equal(Cases, loaded + refused);
        Assert.True(loaded > 0 && refused > 0, $"the corpus exercises both outcomes: {loaded} loaded, {refused} refused");
        output.WriteLine($"fuzz corpus: {Cases} mutated documents, {loaded} loaded, {refused} refused with a located error");
    }
}
