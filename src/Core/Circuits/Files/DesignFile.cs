namespace Patchproof.Core.Circuits.Files;

/// <summary>Constants of the design file format, <c>"format": "patchproof-design"</c>, version 1 (docs/circuits.md).</summary>
public static class DesignFile
{
    /// <summary>The value of the <c>format</c> field.</summary>
    public const string FormatName = "patchproof-design";

    /// <summary>The version this code reads and writes.</summary>
    public const int CurrentVersion = 1;
}
