namespace Patchproof.Client.Models;

/// <summary>What the server said when it refused or could not answer: an RFC 9457 problem in plain words.</summary>
/// <param name="Status">The HTTP status, or 0 when no answer came at all.</param>
/// <param name="Title">A short line a person can read.</param>
/// <param name="Detail">The longer explanation, or null.</param>
/// <param name="Locations">Located errors (file, line, column, message) that came with the problem.</param>
public sealed record ApiProblem(int Status, string Title, string? Detail, IReadOnlyList<string> Locations)
{
    /// <summary>A problem with no located errors.</summary>
    public ApiProblem(int status, string title, string? detail)
        : this(status, title, detail, [])
    {
    }

    /// <summary>True when the server has no such endpoint yet (404 on an API route, 501).</summary>
    public bool IsNotAvailable => Status is 404 or 405 or 501;

    /// <summary>The problem as one sentence for a screen.</summary>
    public string ToText() => Detail is { Length: > 0 } detail ? $"{Title}: {detail}" : Title;
}

/// <summary>The outcome of one call to the server: a value, or the problem that stopped it.</summary>
/// <typeparam name="T">The value's type.</typeparam>
public sealed record ApiResult<T>
{
    private ApiResult(T? value, ApiProblem? problem)
    {
        ValueOrDefault = value;
        Problem = problem;
    }

    /// <summary>The value, or default when the call failed.</summary>
    public T? ValueOrDefault { get; }

    /// <summary>Why the call failed, or null when it succeeded.</summary>
    public ApiProblem? Problem { get; }

    /// <summary>True when the call succeeded.</summary>
    public bool Succeeded => Problem is null;

    /// <summary>The value; throws when the call failed.</summary>
    public T Value => Succeeded ? ValueOrDefault! : throw new InvalidOperationException("The call failed: " + Problem!.ToText());

    /// <summary>A successful outcome.</summary>
    public static ApiResult<T> Ok(T value) => new(value, null);

    /// <summary>A failed outcome.</summary>
    public static ApiResult<T> Fail(ApiProblem problem) => new(default, problem);

    /// <summary>A failed outcome from a status and a title.</summary>
    public static ApiResult<T> Fail(int status, string title, string? detail = null) => new(default, new ApiProblem(status, title, detail));
}
