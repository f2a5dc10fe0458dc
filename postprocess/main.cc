// fickcast-post: the command-line entry point (exit codes as for fickcast: 2 bad input, 3 I/O).
#include "post_commands.h"
#include "post_error.h"

#include <vtkObject.h>

#include <iostream>

int main(int argc, char **argv)
{
  // VTK reports reader problems through observers (turned into one-line errors), never on stderr.
  vtkObject::GlobalWarningDisplayOff();
  try
    {
      return fickcast::post::run_command(std::vector<std::string>(argv + 1, argv + argc));
    }
  catch (const fickcast::post::PostInputError &error)
    {
      std::cerr << "fickcast-post: " << error.what() << '\n';
      return 2;
    }
  catch (const fickcast::post::PostIoError &error)
    {
      std::cerr << "fickcast-post: " << error.what() << '\n';
      return 3;
    }
  catch (const std::exception &error)
    {
      std::cerr << "fickcast-post: internal error: " << fickcast::post::one_line(error.what()) << '\n';
      return 1;
    }
}
