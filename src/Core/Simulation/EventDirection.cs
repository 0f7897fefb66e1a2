namespace Patchproof.Core.Simulation;

/// <summary>Which sign changes of an event function count as events, judged as time increases (also when integrating backwards).</summary>
public enum EventDirection
{
    /// <summary>Both rising and falling crossings.</summary>
    Any,

    /// <summary>Only crossings from negative to non-negative.</summary>
    Rising,

    /// <summary>Only crossings from positive to non-positive.</summary>
    Falling,
}
