// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.Serialization;

namespace Periodic.Tests.Serialization;

/// <summary>Malformed files throw the documented exception with a location.</summary>
public sealed partial class StructureFileTest
{
    [Fact]
    public void StructureFile_BadInputThrowsTheDocumentedException()
    {
        // Malformed JSON and bad values are reported as StructureFileException (a FormatException) with a location.
        foreach (var json in new[] { "", "{", "[]", "{\"cell\": 5}", "{\"layers\": [{\"width\": \"NaN\"}]}" })
        {
            var ex = Assert.ThrowsAny<FormatException>(() => StructureFile.Parse(json, "test.json"));
            Assert.IsType<StructureFileException>(ex);
            Assert.Equal("test.json", ((StructureFileException)ex).SourceName);
            Assert.False(string.IsNullOrWhiteSpace(ex.Message));
        }
        Assert.ThrowsAny<ArgumentNullException>(() => StructureFile.Parse((string)null!, "x"));
    }
}
