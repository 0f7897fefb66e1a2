using System.Collections.Immutable;

namespace Patchproof.Core.Simulation.Synthesis;

/// <summary>How a board trace becomes a scope capture: channels, noise, seed and where the trigger sits.</summary>
/// <param name="Channels">The channels, in file order.</param>
/// <param name="NoiseVolts">The standard deviation of white Gaussian noise added before quantization, volts.</param>
/// <param name="Seed">The random seed; the same seed gives the same capture.</param>
/// <param name="TriggerSampleIndex">The trace sample that becomes capture time 0 (earlier samples get negative times).</param>
public sealed record CaptureSynthesisOptions(ImmutableArray<ScopeChannelSettings> Channels, double NoiseVolts, int Seed, int TriggerSampleIndex);
