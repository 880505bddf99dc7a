#include "settlewell/core/python_scripts.h"

#include <cstdlib>
#include <filesystem>
#include <ostream>
#include <vector>

namespace settlewell {

namespace fs = std::filesystem;

namespace {

std::string shell_quote(const std::string& s) {
  std::string q = "'";
  for (const char c : s)
    q += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return q + "'";
}

std::string plot_python() {
  std::vector<std::string> candidates;
  if (const char* env = std::getenv("SETTLEWELL_PYTHON"))
    candidates.emplace_back(env);
  candidates.insert(candidates.end(), {"/usr/bin/python3", "python3"});
  // Finding the modules without importing them costs 30 ms where importing costs
  // half a second; a module found but broken fails the script, whose log says why.
  const std::string probe =
      " -c 'import importlib.util as u; "
      "exit(0 if u.find_spec(\"vtk\") and u.find_spec(\"matplotlib\") else 1)'"
      " >/dev/null 2>&1";
  for (const auto& py : candidates)
    if (std::system((shell_quote(py) + probe).c_str()) == 0)
      return py;
  return "";
}

std::string script_path(const std::string& script) {
  if (const char* env = std::getenv("SETTLEWELL_POSTPROCESS_DIR"))
    return std::string(env) + "/" + script;
  return std::string(SETTLEWELL_SOURCE_DIR) + "/postprocess/" + script;
}

} // namespace

std::string run_postprocess(const std::string& script,
                            const std::vector<std::string>& arguments,
                            const std::string& log_file,
                            std::ostream& log) {
  const std::string py = plot_python();
  if (py.empty())
    return "no Python with VTK and matplotlib was found (Debian: python3-vtk9, "
           "python3-matplotlib; or set SETTLEWELL_PYTHON)";
  const std::string path = script_path(script);
  if (!fs::exists(path))
    return "the script " + path + " is missing";
  log << "running " << script << " with " << py << " ...\n";
  std::string command = shell_quote(py) + " " + shell_quote(path);
  for (const auto& a : arguments)
    command += " " + shell_quote(a);
  command += " > " + shell_quote(log_file) + " 2>&1";
  if (std::system(command.c_str()) != 0)
    return script + " failed; see " + log_file;
  return "";
}

} // namespace settlewell
