namespace Patchproof.Core.Captures.Checks;

/// <summary>One check of a capture's quality; checks that know the model get its expectations through the context.</summary>
/// <remarks>
/// This is the hook for model-aware checks: a later stage fills <see cref="CaptureCheckContext.Expectations"/>
/// (for example "channel z must have a non-zero mean") and adds its own checks to the list run by
/// <see cref="CaptureInspection"/>. A check never throws for a poor capture; it reports.
/// </remarks>
public interface ICaptureCheck
{
    /// <summary>The id every result of this check carries.</summary>
    string Id { get; }

    /// <summary>Runs the check.</summary>
    /// <param name="capture">The capture to examine.</param>
    /// <param name="context">What is known about the capture beyond its samples.</param>
    /// <returns>Zero or more results.</returns>
    IEnumerable<CaptureCheckResult> Run(Capture capture, CaptureCheckContext context);
}

/// <summary>What a model says about one channel, for model-aware checks.</summary>
/// <param name="Channel">The channel's name or 1-based position.</param>
/// <param name="Variable">The model variable it shows, for messages ("z").</param>
/// <param name="MustHaveNonZeroMean">True when the variable's mean over the attractor is far from zero (Lorenz z), so a zero mean means AC coupling.</param>
public sealed record ChannelExpectation(string Channel, string Variable, bool MustHaveNonZeroMean);

/// <summary>What is known about a capture beyond its samples: the channel statistics computed once, and the model's expectations.</summary>
/// <param name="Expectations">Expectations per channel from the model; empty when no model is known.</param>
public sealed record CaptureCheckContext(IReadOnlyList<ChannelExpectation> Expectations)
{
    /// <summary>No model known.</summary>
    public static CaptureCheckContext WithoutModel { get; } = new([]);
}
