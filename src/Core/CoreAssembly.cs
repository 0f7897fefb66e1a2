using System.Reflection;

namespace Patchproof.Core;

/// <summary>Identifies the numeric core that produced a result, for reports and health answers.</summary>
public static class CoreAssembly
{
    /// <summary>The informational version of the core library, for example <c>0.1.0</c>.</summary>
    /// <remarks>Read once from the assembly's metadata; it is stamped into every report so a result can be traced to the code that made it.</remarks>
    public static string Version { get; } =
        typeof(CoreAssembly).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion.Split('+')[0]
        ?? typeof(CoreAssembly).Assembly.GetName().Version?.ToString()
        ?? "0.0.0";
}
