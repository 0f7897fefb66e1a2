namespace Patchproof.Core.Captures.Checks;

/// <summary>What one check found about a capture (or one of its channels).</summary>
/// <remarks>
/// <see cref="Values"/> holds the numbers behind the sentence, keyed by names that carry their unit
/// (<c>stepMillivolts</c>, <c>fractionAtTop</c>, <c>samplesPerPeriod</c>); ratios and counts have no unit.
/// </remarks>
/// <param name="Id">The check's stable id, for example <c>clipping</c>; docs/captures.md lists them.</param>
/// <param name="Severity">Info (for the record), Warning (the fit may suffer) or Error (the capture cannot be used as it is).</param>
/// <param name="Channel">The channel concerned, or null for the whole capture.</param>
/// <param name="Message">One sentence a bench technician understands, with what to do.</param>
/// <param name="Values">The numbers behind the message.</param>
public sealed record CaptureCheckResult(string Id, DiagnosticSeverity Severity, string? Channel, string Message, IReadOnlyDictionary<string, double> Values);
