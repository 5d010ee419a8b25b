// ferrum: condition assessment of power transformers. See README.md.
#include <exception>
#include <iostream>

#include "daemon/app/ferrum_app.h"

int main(int argc, char** argv) {
  try {
    ferrum::app::FerrumApp app;
    return app.run(argc, argv);
  } catch (const std::exception& e) {
    std::cerr << "ferrum: " << e.what() << "\n";
    return 1;
  }
}
